/** A revision's content as stored (notes and change note in their own columns, the rest as JSON). */
import type { z } from '$lib/zod';
import type { RevisionContent } from '$lib/schemas/design';
import type { Revision } from '../db/schema';
import { DomainError } from '../http/errors';

type StoredContent = Omit<RevisionContent, 'notes' | 'change_note'>;

function splitContent(content: RevisionContent) {
	const { notes, change_note, ...rest } = content;
	return { notes, changeNote: change_note, stored: rest as StoredContent };
}

export function revisionColumns(content: RevisionContent) {
	const { notes, changeNote, stored } = splitContent(content);
	return {
		notes,
		changeNote,
		content: stored as unknown as Record<string, unknown>,
		designHz: content.design_frequency_hz,
		claimLoHz: content.claim.band_lo_hz,
		claimHiHz: content.claim.band_hi_hz
	};
}

/** The revision's full content as the schema describes it. */
export function contentOf(r: Revision): RevisionContent {
	return { ...(r.content as unknown as StoredContent), notes: r.notes, change_note: r.changeNote };
}

/** Schema problems are the caller's input: a 400 naming the field, never a 500. */
export function validated<T>(schema: z.ZodType<T>, value: unknown): T {
	const r = schema.safeParse(value);
	if (r.success) return r.data;
	const issue = r.error.issues[0];
	const field = issue.path.map(String).join('.');
	throw new DomainError(400, `${field ? field + ': ' : ''}${issue.message}`, field || undefined);
}

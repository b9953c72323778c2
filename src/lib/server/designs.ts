import { desc, eq, sql } from 'drizzle-orm';
import { db } from './db';
import { designs, revisions, users, type Design, type Revision } from './db/schema';
import type { z } from '$lib/zod';
import { designMetaSchema, revisionContentSchema, type DesignMeta, type RevisionContent } from '$lib/schemas/design';
import { newId } from './accounts';
import { DomainError } from './errors';
import { isSlug, slugify } from './slug';
import { reindexDesign } from './search';
import { assertCompilable } from './dimensions';
import type { SessionUser } from './auth';

export type StoredContent = Omit<RevisionContent, 'notes' | 'change_note'>;

export function splitContent(content: RevisionContent) {
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

const RESERVED_SLUGS = ['new', 'compare', 'api', 'edit'];

export function slugTaken(slug: string): boolean {
	return !!db.select({ id: designs.id }).from(designs).where(eq(designs.slug, slug)).get();
}

/** A free slug near the wanted one ("biquad", "biquad-2", …) for suggestions. */
export function freeSlug(wanted: string): string {
	const base = slugify(wanted);
	if (!slugTaken(base)) return base;
	for (let i = 2; i < 1000; i++) if (!slugTaken(`${base}-${i}`)) return `${base}-${i}`;
	return `${base}-${newId().slice(0, 6)}`;
}

/** Creates the design and its first revision, r1, as a draft, in one transaction. */
export function createDesign(
	author: Pick<SessionUser, 'id'>,
	metaIn: DesignMeta,
	contentIn: RevisionContent,
	options: { isDemo?: boolean; now?: Date } = {}
) {
	const meta = validated(designMetaSchema, metaIn);
	const content = validated(revisionContentSchema, contentIn);
	assertCompilable(content);
	const slug = meta.slug ?? slugify(meta.title);
	if (RESERVED_SLUGS.includes(slug)) {
		throw new DomainError(409, `"${slug}" is a reserved address; choose another.`, 'slug');
	}
	if (slugTaken(slug)) {
		throw new DomainError(409, `The address "${slug}" is taken; try "${freeSlug(slug)}".`, 'slug');
	}
	const now = options.now ?? new Date();
	const designId = newId();
	const revisionId = newId();
	db.transaction((tx) => {
		tx.insert(designs)
			.values({
				id: designId,
				slug,
				title: meta.title,
				family: meta.family,
				polarization: meta.polarization,
				summary: meta.summary,
				ownerId: author.id,
				isDemo: options.isDemo ?? false,
				createdAt: now,
				updatedAt: now
			})
			.run();
		tx.insert(revisions)
			.values({ id: revisionId, designId, number: 1, authorId: author.id, state: 'draft', createdAt: now, updatedAt: now, ...revisionColumns(content) })
			.run();
	});
	return { designId, slug, revisionId };
}

// The lookups every design page and API call makes, prepared once (building a drizzle query costs
// more than running it).
const designBySlug = db.select().from(designs).where(eq(designs.slug, sql.placeholder('slug'))).prepare();
const userName = db.select({ n: users.displayName }).from(users).where(eq(users.id, sql.placeholder('id'))).prepare();
const revisionById = db.select().from(revisions).where(eq(revisions.id, sql.placeholder('id'))).prepare();
const revisionsOfDesign = db
	.select({
		id: revisions.id,
		number: revisions.number,
		state: revisions.state,
		authorId: revisions.authorId,
		authorName: users.displayName,
		changeNote: revisions.changeNote,
		createdAt: revisions.createdAt,
		submittedAt: revisions.submittedAt,
		decidedAt: revisions.decidedAt
	})
	.from(revisions)
	.innerJoin(users, eq(users.id, revisions.authorId))
	.where(eq(revisions.designId, sql.placeholder('designId')))
	.orderBy(desc(revisions.number))
	.prepare();

export function getDesignBySlug(slug: string): Design | null {
	if (!isSlug(slug)) return null;
	return designBySlug.get({ slug }) ?? null;
}

export function ownerName(userId: string): string {
	return userName.get({ id: userId })?.n ?? 'unknown';
}

export function getRevisionById(id: string): Revision | null {
	return revisionById.get({ id }) ?? null;
}

/** Newest first. */
export function listRevisions(designId: string) {
	return revisionsOfDesign.all({ designId });
}

/**
 * What a reader sees by default: the newest approved revision, else the newest submitted one
 * (designs.listed_revision_id, which triggers keep equal to that).
 */
export function defaultRevision(design: Design): Revision | null {
	return design.listedRevisionId ? getRevisionById(design.listedRevisionId) : null;
}

export function updateDesignMeta(user: SessionUser, design: Design, metaIn: Omit<DesignMeta, 'slug'>) {
	if (design.ownerId !== user.id) throw new DomainError(403, 'Only the design owner can change its title and summary.');
	const meta = validated(designMetaSchema.omit({ slug: true }), metaIn);
	db.update(designs)
		.set({ ...meta, updatedAt: new Date() })
		.where(eq(designs.id, design.id))
		.run();
	reindexDesign(design.id);
}

export const designCount = () => db.select({ n: sql<number>`count(*)` }).from(designs).get()?.n ?? 0;

/** A first draft: one quarter-wave row and a ±2 % claim around the design frequency. */
export function starterContent(hz: number): RevisionContent {
	return {
		design_frequency_hz: hz,
		parameters: [],
		rows: [{ key: 'quarter_wave', label: 'Quarter wavelength', formula: 'lambda / 4', kind: 'resonant' }],
		claim: { centre_hz: hz, band_lo_hz: Math.round(hz * 0.98), band_hi_hz: Math.round(hz * 1.02), vswr_max: 2 },
		notes: '',
		change_note: 'First draft.'
	};
}

import { eq } from 'drizzle-orm';
import { db } from '../db';
import { designs, revisions } from '../db/schema';
import {
	designMetaSchema,
	revisionContentSchema,
	type DesignMeta,
	type RevisionContent
} from '$lib/schemas/design';
import { newId } from '../accounts/accounts';
import { DomainError } from '../http/errors';
import { slugify } from './slug';
import { revisionColumns, validated } from './content';
import { assertCompilable } from './dimensions';
import type { SessionUser } from '../accounts/auth';

const RESERVED_SLUGS = ['new', 'compare', 'api', 'edit'];

function slugTaken(slug: string): boolean {
	return !!db.select({ id: designs.id }).from(designs).where(eq(designs.slug, slug)).get();
}

/** A free slug near the wanted one ("biquad", "biquad-2", …) for suggestions. */
function freeSlug(wanted: string): string {
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
			.values({
				id: revisionId,
				designId,
				number: 1,
				authorId: author.id,
				state: 'draft',
				createdAt: now,
				updatedAt: now,
				...revisionColumns(content)
			})
			.run();
	});
	return { designId, slug, revisionId };
}

/** A first draft: one quarter-wave row and a ±2 % claim around the design frequency. */
export function starterContent(hz: number): RevisionContent {
	return {
		design_frequency_hz: hz,
		parameters: [],
		rows: [
			{ key: 'quarter_wave', label: 'Quarter wavelength', formula: 'lambda / 4', kind: 'resonant' }
		],
		claim: {
			centre_hz: hz,
			band_lo_hz: Math.round(hz * 0.98),
			band_hi_hz: Math.round(hz * 1.02),
			vswr_max: 2
		},
		notes: '',
		change_note: 'First draft.'
	};
}

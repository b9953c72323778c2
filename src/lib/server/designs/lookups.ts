/** Reading designs and revisions: the lookups every page, API and module makes, prepared once. */
import { and, desc, eq, sql } from 'drizzle-orm';
import { db } from '../db';
import { designs, revisions, users, type Design, type Revision } from '../db/schema';
import type { SessionUser } from '../accounts/auth';
import { isSlug } from './slug';

// The lookups every design page and API call makes, prepared once (building a drizzle query costs
// more than running it).
const designBySlug = db
	.select()
	.from(designs)
	.where(eq(designs.slug, sql.placeholder('slug')))
	.prepare();
const revisionById = db
	.select()
	.from(revisions)
	.where(eq(revisions.id, sql.placeholder('id')))
	.prepare();
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

const revisionByNumber = db
	.select()
	.from(revisions)
	.where(
		and(
			eq(revisions.designId, sql.placeholder('designId')),
			eq(revisions.number, sql.placeholder('number'))
		)
	)
	.prepare();

/** Whether a number can name a revision at all (checked before any lookup). */
const isRevisionNumber = (n: number): boolean => Number.isInteger(n) && n >= 1 && n <= 100_000;

export function getRevision(designId: string, number: number): Revision | null {
	if (!isRevisionNumber(number)) return null;
	return revisionByNumber.get({ designId, number }) ?? null;
}

const revisionHeadBySlug = db
	.select({
		id: revisions.id,
		number: revisions.number,
		state: revisions.state,
		authorId: revisions.authorId,
		designHz: revisions.designHz,
		claimLoHz: revisions.claimLoHz,
		claimHiHz: revisions.claimHiHz,
		updatedAt: revisions.updatedAt
	})
	.from(revisions)
	.innerJoin(designs, eq(designs.id, revisions.designId))
	.where(
		and(eq(designs.slug, sql.placeholder('slug')), eq(revisions.number, sql.placeholder('number')))
	)
	.prepare();

/**
 * A revision by its design's address and number, without notes and content: enough to authorize
 * and to find its compiled table, in one lookup.
 */
export function getRevisionHead(slug: string, number: number) {
	if (!isSlug(slug) || !isRevisionNumber(number)) return null;
	return revisionHeadBySlug.get({ slug, number }) ?? null;
}

/** Drafts are private to their author; every other state is public. */
export function canRead(
	user: SessionUser | null,
	r: Pick<Revision, 'state' | 'authorId'>
): boolean {
	return r.state !== 'draft' || r.authorId === user?.id;
}

/** The one check every write to a revision's content goes through. */

/** Reviews and verdicts: the one place that writes the reviews table and decides revision states. */
import { and, asc, eq, inArray, isNull, ne, sql } from 'drizzle-orm';
import { db } from '../db';
import {
	comments,
	designs,
	reviews,
	revisions,
	users,
	type Design,
	type Revision
} from '../db/schema';
import {
	APPROVAL_POLICY,
	decideRevisionState,
	type ApprovalPolicy,
	type PolicyState
} from '$lib/server/reviews/policy';
import { reviewSchema, type VerdictValue } from '$lib/schemas/review';
import { bandById } from '$lib/rf/units/bands';
import { DomainError } from '../http/errors';
import { audit } from '../moderation/audit';
import { newId } from '../accounts/accounts';
import { reindexDesign } from '../designs/search';
import { ownerName } from '../accounts/users';
import { notifyRejectConfirmed, notifyReview, type Tx } from '../mail/notify';
import type { SessionUser } from '../accounts/auth';

export const isReviewer = (u: SessionUser | null) =>
	!!u && u.emailVerified && (u.role === 'reviewer' || u.role === 'moderator');
const isModerator = (u: SessionUser | null) => !!u && u.emailVerified && u.role === 'moderator';

export interface ReviewOptions {
	now?: Date;
	/** Seeding demo data passes false: no mail for invented people. */
	notify?: boolean;
	policy?: ApprovalPolicy;
}

// Prepared once; better-sqlite3 has one connection, so they also serve inside transactions.
const verdictsQuery = db
	.select()
	.from(reviews)
	.where(eq(reviews.revisionId, sql.placeholder('revisionId')))
	.orderBy(asc(reviews.createdAt))
	.prepare();
const threadsQuery = db
	.select({ resolvedAt: comments.resolvedAt })
	.from(comments)
	.where(and(eq(comments.revisionId, sql.placeholder('revisionId')), isNull(comments.parentId)))
	.prepare();

function verdictsOf(revisionId: string) {
	return verdictsQuery.all({ revisionId });
}

type Verdicts = ReturnType<typeof verdictsOf>;

/** Verdicts as the approval policy reads them. */
const policyVerdicts = (verdicts: Verdicts) =>
	verdicts.map((v) => ({
		reviewerId: v.reviewerId,
		verdict: v.verdict,
		createdAt: v.createdAt.getTime()
	}));

/** Where the policy puts a revision with these reviews (authors' own verdicts never count). */
export function decisionFor(
	r: Revision,
	policy: ApprovalPolicy = APPROVAL_POLICY,
	verdicts: Verdicts = verdictsOf(r.id)
) {
	const decision = decideRevisionState(policyVerdicts(verdicts), policy, r.authorId);
	// The policy names reviewers by id; people read names.
	let reason = decision.reason;
	for (const v of decision.current)
		reason = reason.split(v.reviewerId).join(ownerName(v.reviewerId));
	return { ...decision, reason };
}

/** Why a reviewer may not give a verdict on this revision, as the error a route shows. */
function assertReviewable(user: SessionUser, r: Revision, design: Design): void {
	if (!isReviewer(user)) throw new DomainError(403, 'Only reviewers can give a verdict.');
	if (r.authorId === user.id || design.ownerId === user.id) {
		throw new DomainError(403, 'You cannot review your own revision.');
	}
	if (r.state === 'draft') throw new DomainError(404, 'No such revision.');
	if (r.state === 'withdrawn')
		throw new DomainError(409, `r${r.number} was withdrawn by its author; it cannot be reviewed.`);
	if (r.state !== 'submitted') {
		throw new DomainError(
			409,
			`r${r.number} is already decided (${r.state}); review the newest revision instead.`
		);
	}
}

/** Sets the revision's state from the policy's decision, inside the caller's transaction. */
function applyDecision(
	tx: Tx,
	actorId: string,
	r: Revision,
	design: Design,
	state: PolicyState,
	reason: string,
	now: Date
) {
	if (state !== 'approved' && state !== 'returned') return false;
	const updated = tx
		.update(revisions)
		.set({ state, decidedAt: now })
		.where(and(eq(revisions.id, r.id), eq(revisions.state, 'submitted')))
		.returning()
		.get();
	if (!updated) throw new DomainError(409, 'This revision changed meanwhile; reload the page.');
	if (state === 'approved') {
		const shown = design.shownRevisionId
			? tx.select().from(revisions).where(eq(revisions.id, design.shownRevisionId)).get()
			: undefined;
		// The design shows its newest approved revision; approving an older one leaves that alone.
		if (!shown || shown.number < r.number) {
			tx.update(designs)
				.set({ shownRevisionId: r.id, updatedAt: now })
				.where(eq(designs.id, design.id))
				.run();
		}
	}
	audit(
		{
			actorId,
			action: state === 'approved' ? 'revision.approve' : 'revision.return',
			targetType: 'revision',
			targetId: r.id,
			details: { number: r.number, design: design.slug, reason }
		},
		tx
	);
	return true;
}

export function submitReview(
	user: SessionUser,
	revisionId: string,
	input: { verdict: string; summary: string },
	options: ReviewOptions = {}
) {
	const parsed = reviewSchema.safeParse(input);
	if (!parsed.success) {
		const issue = parsed.error.issues[0];
		throw new DomainError(422, issue.message, String(issue.path[0] ?? 'summary'));
	}
	const now = options.now ?? new Date();
	const result = db.transaction((tx) => {
		const r = tx.select().from(revisions).where(eq(revisions.id, revisionId)).get();
		if (!r) throw new DomainError(404, 'No such revision.');
		const design = tx.select().from(designs).where(eq(designs.id, r.designId)).get()!;
		assertReviewable(user, r, design);
		const id = newId();
		tx.insert(reviews)
			.values({
				id,
				revisionId: r.id,
				reviewerId: user.id,
				verdict: parsed.data.verdict,
				summary: parsed.data.summary,
				createdAt: now
			})
			.run();
		audit(
			{
				actorId: user.id,
				action: 'review.submit',
				targetType: 'revision',
				targetId: r.id,
				details: { review: id, verdict: parsed.data.verdict, number: r.number }
			},
			tx
		);
		const decision = decideRevisionState(
			policyVerdicts(verdictsOf(r.id)),
			options.policy ?? APPROVAL_POLICY,
			r.authorId
		);
		const changed = applyDecision(tx, user.id, r, design, decision.state, decision.reason, now);
		if (options.notify !== false) {
			notifyReview(
				{
					design,
					revision: r,
					reviewerName: user.displayName,
					verdict: parsed.data.verdict,
					summary: parsed.data.summary,
					reviewId: id
				},
				tx
			);
		}
		return { id, state: decision.state, reason: decision.reason, changed, designId: design.id };
	});
	if (result.changed) reindexDesign(result.designId);
	return { id: result.id, state: result.state, reason: result.reason };
}

/**
 * A moderator confirms a reviewer's reject. Our choice: the revision becomes `returned` (the author
 * may start a new one) and the confirmed reject stays on record (reviews.confirmed_by_id).
 */
export function confirmReject(user: SessionUser, reviewId: string, options: ReviewOptions = {}) {
	if (!isModerator(user)) throw new DomainError(403, 'Only a moderator can confirm a rejection.');
	const now = options.now ?? new Date();
	const designId = db.transaction((tx) => {
		const review = tx.select().from(reviews).where(eq(reviews.id, reviewId)).get();
		if (!review) throw new DomainError(404, 'No such review.');
		if (review.verdict !== 'reject')
			throw new DomainError(409, 'Only a reject verdict needs confirming.');
		if (review.confirmedAt) throw new DomainError(409, 'This rejection is already confirmed.');
		const r = tx.select().from(revisions).where(eq(revisions.id, review.revisionId)).get()!;
		const design = tx.select().from(designs).where(eq(designs.id, r.designId)).get()!;
		if (r.state !== 'submitted')
			throw new DomainError(409, `r${r.number} is ${r.state}; there is nothing to confirm.`);
		if (r.authorId === user.id || design.ownerId === user.id) {
			throw new DomainError(403, 'You cannot confirm a rejection of your own design.');
		}
		// Confirming is a second person's check: the one who rejected cannot also confirm.
		if (review.reviewerId === user.id) {
			throw new DomainError(403, 'Another moderator must confirm your own rejection.');
		}
		tx.update(reviews)
			.set({ confirmedById: user.id, confirmedAt: now })
			.where(eq(reviews.id, review.id))
			.run();
		audit(
			{
				actorId: user.id,
				action: 'review.reject_confirm',
				targetType: 'review',
				targetId: review.id,
				details: { revision: r.id, number: r.number }
			},
			tx
		);
		applyDecision(
			tx,
			user.id,
			r,
			design,
			'returned',
			`Rejection by ${ownerName(review.reviewerId)} confirmed by ${user.displayName}.`,
			now
		);
		if (options.notify !== false)
			notifyRejectConfirmed({ design, revision: r, moderatorName: user.displayName }, tx);
		return design.id;
	});
	reindexDesign(designId);
}

/** The pending rejects this user may confirm: a moderator's, not their own, not on their own design. */
export function confirmableRejects(r: Revision, design: Design, user: SessionUser) {
	if (!isModerator(user) || r.authorId === user.id || design.ownerId === user.id) return [];
	return verdictsOf(r.id)
		.filter((v) => v.verdict === 'reject' && !v.confirmedAt && v.reviewerId !== user.id)
		.map((v) => ({ id: v.id, reviewerName: ownerName(v.reviewerId) }));
}

export interface ReviewView {
	id: string;
	verdict: VerdictValue;
	summary: string;
	reviewerName: string;
	createdAt: string;
	confirmedBy: string | null;
	confirmedAt: string | null;
}

export function reviewsFor(
	revisionId: string,
	verdicts: Verdicts = verdictsOf(revisionId)
): ReviewView[] {
	return verdicts.map((v) => ({
		id: v.id,
		verdict: v.verdict,
		summary: v.summary,
		reviewerName: ownerName(v.reviewerId),
		createdAt: v.createdAt.toISOString(),
		confirmedBy: v.confirmedById ? ownerName(v.confirmedById) : null,
		confirmedAt: v.confirmedAt?.toISOString() ?? null
	}));
}

export interface QueueFilters {
	family?: string | null;
	band?: string | null;
	mine?: boolean;
}

/** Submitted revisions waiting for review, oldest first; never the reviewer's own. */
export function listQueue(user: SessionUser, filters: QueueFilters = {}) {
	const rows = db
		.select({
			revisionId: revisions.id,
			number: revisions.number,
			designHz: revisions.designHz,
			submittedAt: revisions.submittedAt,
			authorId: revisions.authorId,
			slug: designs.slug,
			title: designs.title,
			family: designs.family,
			ownerId: designs.ownerId,
			authorName: users.displayName
		})
		.from(revisions)
		.innerJoin(designs, eq(designs.id, revisions.designId))
		.innerJoin(users, eq(users.id, revisions.authorId))
		.where(
			and(
				eq(revisions.state, 'submitted'),
				ne(revisions.authorId, user.id),
				ne(designs.ownerId, user.id),
				filters.family ? eq(designs.family, filters.family) : undefined
			)
		)
		.orderBy(asc(revisions.submittedAt), asc(revisions.createdAt))
		.all();
	const band = filters.band ? bandById(filters.band) : undefined;
	const inBand = rows.filter(
		(r) => !band || (r.designHz >= band.lo_hz && r.designHz <= band.hi_hz)
	);
	const ids = inBand.map((r) => r.revisionId);
	const allReviews = ids.length
		? db.select().from(reviews).where(inArray(reviews.revisionId, ids)).all()
		: [];
	const myComments = ids.length
		? new Set(
				db
					.select({ id: comments.revisionId })
					.from(comments)
					.where(and(inArray(comments.revisionId, ids), eq(comments.authorId, user.id)))
					.all()
					.map((c) => c.id)
			)
		: new Set<string>();
	return inBand
		.map((r) => {
			const own = allReviews.filter((v) => v.revisionId === r.revisionId);
			const decision = decideRevisionState(
				own.map((v) => ({
					reviewerId: v.reviewerId,
					verdict: v.verdict,
					createdAt: v.createdAt.getTime()
				})),
				APPROVAL_POLICY,
				r.authorId
			);
			const mine = myComments.has(r.revisionId) || own.some((v) => v.reviewerId === user.id);
			return {
				slug: r.slug,
				title: r.title,
				family: r.family,
				number: r.number,
				designHz: r.designHz,
				authorName: r.authorName,
				submittedAt: r.submittedAt?.toISOString() ?? null,
				reviewCount: own.length,
				rejectPending: decision.state === 'reject_pending',
				mine
			};
		})
		.filter((r) => !filters.mine || r.mine);
}

/**
 * The design page's reviews section (spread into revisionPageData). `history` is the design's
 * revisions newest first, as the page already has them.
 */
export function reviewsPanelData(
	r: Revision,
	user: SessionUser | null,
	history: Pick<Revision, 'number' | 'state' | 'authorId'>[]
) {
	const verdicts = r.state === 'draft' ? [] : verdictsOf(r.id);
	const threads = threadsQuery.all({ revisionId: r.id });
	const previous = history.find(
		(p) => p.number < r.number && (p.state !== 'draft' || p.authorId === user?.id)
	);
	return {
		reviewsPanel: {
			reviews: reviewsFor(r.id, verdicts),
			threads: threads.length,
			openThreads: threads.filter((t) => t.resolvedAt === null).length,
			rejectPending:
				r.state === 'submitted' &&
				decisionFor(r, APPROVAL_POLICY, verdicts).state === 'reject_pending',
			canOpenReview: r.state !== 'draft' && (isReviewer(user) || user?.id === r.authorId),
			previousNumber: previous?.number ?? null
		}
	};
}

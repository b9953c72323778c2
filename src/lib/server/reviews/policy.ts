/** Which state a submitted revision is in, given its reviews. Pure: the caller loads and stores. */

export type Verdict = 'approve' | 'revise' | 'reject';
export type PolicyState = 'submitted' | 'approved' | 'returned' | 'reject_pending';

export interface ReviewVerdict {
	reviewerId: string;
	verdict: Verdict;
	/** Milliseconds since the epoch. */
	createdAt: number;
	superseded?: boolean;
}

export interface ApprovalPolicy {
	/** Distinct reviewers whose current verdict is approve. */
	approvalsNeeded: number;
	/** A reject only takes effect once a moderator confirms it. */
	rejectNeedsModerator: boolean;
}

export const APPROVAL_POLICY: Readonly<ApprovalPolicy> = Object.freeze({
	approvalsNeeded: 1,
	rejectNeedsModerator: true
});

export interface RevisionDecision {
	state: PolicyState;
	reason: string;
	/** Each reviewer's verdict that counts, after later verdicts replaced earlier ones. */
	current: ReviewVerdict[];
}

/** Thrown for malformed review records; these come from the database, never from a form. */
export class ReviewPolicyError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'ReviewPolicyError';
	}
}

const VERDICTS: readonly string[] = ['approve', 'revise', 'reject'];

function check(reviews: ReviewVerdict[], policy: ApprovalPolicy) {
	if (!Array.isArray(reviews)) throw new ReviewPolicyError('reviews must be a list');
	if (!Number.isInteger(policy.approvalsNeeded) || policy.approvalsNeeded < 1) {
		throw new ReviewPolicyError('approvalsNeeded must be a whole number of at least 1');
	}
	reviews.forEach((r, i) => {
		if (typeof r?.reviewerId !== 'string' || r.reviewerId === '') {
			throw new ReviewPolicyError(`reviews[${i}].reviewerId is missing`);
		}
		if (!VERDICTS.includes(r.verdict)) {
			throw new ReviewPolicyError(`reviews[${i}].verdict must be approve, revise or reject`);
		}
		if (!Number.isFinite(r.createdAt)) {
			throw new ReviewPolicyError(`reviews[${i}].createdAt must be a time`);
		}
	});
}

const names = (list: ReviewVerdict[]) => list.map((r) => r.reviewerId).join(', ');

/**
 * Reject outranks revise, revise outranks approve. An author's own verdicts (when `authorId` is
 * given) never count: authors do not review their own revisions.
 */
export function decideRevisionState(
	reviews: ReviewVerdict[],
	policy: ApprovalPolicy = APPROVAL_POLICY,
	authorId?: string
): RevisionDecision {
	check(reviews, policy);
	const latest = new Map<string, ReviewVerdict>();
	for (const review of reviews) {
		if (review.superseded || review.reviewerId === authorId) continue;
		const seen = latest.get(review.reviewerId);
		// On equal times the later record wins, so a re-sent verdict replaces the first.
		if (!seen || review.createdAt >= seen.createdAt) latest.set(review.reviewerId, review);
	}
	const current = [...latest.values()].sort((a, b) => a.createdAt - b.createdAt);
	const by = (verdict: Verdict) => current.filter((r) => r.verdict === verdict);
	const rejects = by('reject');
	const revises = by('revise');
	const approves = by('approve');

	if (rejects.length > 0) {
		return policy.rejectNeedsModerator
			? {
					state: 'reject_pending',
					reason: `Rejected by ${names(rejects)}; waiting for a moderator to confirm.`,
					current
				}
			: { state: 'returned', reason: `Rejected by ${names(rejects)}.`, current };
	}
	if (revises.length > 0) {
		return { state: 'returned', reason: `Returned for revision by ${names(revises)}.`, current };
	}
	if (approves.length >= policy.approvalsNeeded) {
		return { state: 'approved', reason: `Approved by ${names(approves)}.`, current };
	}
	const waiting = `${approves.length} of ${policy.approvalsNeeded} approvals`;
	return { state: 'submitted', reason: `Waiting for review (${waiting}).`, current };
}

import { describe, expect, it } from 'vitest';
import { APPROVAL_POLICY, ReviewPolicyError, decideRevisionState } from './policy';
import type { ReviewVerdict, Verdict } from './policy';

// Expected states come from the approval rules in the brief (PRODUCT.md, Review; this module's policy).
const r = (
	reviewerId: string,
	verdict: Verdict,
	createdAt: number,
	superseded?: boolean
): ReviewVerdict => ({
	reviewerId,
	verdict,
	createdAt,
	superseded
});
const stateOf = (reviews: ReviewVerdict[], ...rest: [typeof APPROVAL_POLICY?, string?]) =>
	decideRevisionState(reviews, ...rest).state;

describe('decideRevisionState', () => {
	it('stays submitted without reviews', () => {
		const decision = decideRevisionState([]);
		expect(decision.state).toBe('submitted');
		expect(decision.reason).toMatch(/0 of 1/);
	});

	it('one approve approves under the default policy', () => {
		expect(APPROVAL_POLICY).toEqual({ approvalsNeeded: 1, rejectNeedsModerator: true });
		const decision = decideRevisionState([r('ana', 'approve', 1)]);
		expect(decision.state).toBe('approved');
		expect(decision.reason).toContain('ana');
	});

	it('an outstanding revise from another reviewer blocks an approve', () => {
		expect(stateOf([r('ana', 'approve', 2), r('ben', 'revise', 1)])).toBe('returned');
	});

	it('a reviewer who approves after asking for a revision releases the block', () => {
		expect(stateOf([r('ben', 'revise', 1), r('ana', 'approve', 2), r('ben', 'approve', 3)])).toBe(
			'approved'
		);
	});

	it('a later verdict supersedes the same reviewer’s earlier one, whatever the list order', () => {
		expect(stateOf([r('ana', 'revise', 5), r('ana', 'approve', 1)])).toBe('returned');
		expect(stateOf([r('ana', 'approve', 5), r('ana', 'revise', 1)])).toBe('approved');
	});

	it('records flagged as superseded do not count', () => {
		expect(stateOf([r('ben', 'revise', 1, true), r('ana', 'approve', 2)])).toBe('approved');
	});

	it('a reject waits for a moderator and outranks approvals', () => {
		const decision = decideRevisionState([r('ana', 'approve', 1), r('cai', 'reject', 2)]);
		expect(decision.state).toBe('reject_pending');
		expect(decision.reason).toMatch(/moderator/);
	});

	it('a reject without moderator confirmation returns the revision', () => {
		const policy = { approvalsNeeded: 1, rejectNeedsModerator: false };
		expect(stateOf([r('cai', 'reject', 2)], policy)).toBe('returned');
	});

	it('counts distinct reviewers when more approvals are needed', () => {
		const policy = { approvalsNeeded: 2, rejectNeedsModerator: true };
		expect(stateOf([r('ana', 'approve', 1), r('ana', 'approve', 2)], policy)).toBe('submitted');
		expect(stateOf([r('ana', 'approve', 1), r('ben', 'approve', 2)], policy)).toBe('approved');
	});

	it('ignores the author’s own verdicts', () => {
		expect(stateOf([r('author', 'approve', 1)], APPROVAL_POLICY, 'author')).toBe('submitted');
	});

	it('throws its own error for malformed records', () => {
		const bad = [
			{ reviewerId: 'ana', verdict: 'maybe', createdAt: 1 }
		] as unknown as ReviewVerdict[];
		expect(() => decideRevisionState(bad)).toThrow(ReviewPolicyError);
		expect(() => decideRevisionState([r('', 'approve', 1)])).toThrow(/reviewerId/);
		expect(() => decideRevisionState([r('ana', 'approve', Number.NaN)])).toThrow(/createdAt/);
		expect(() =>
			decideRevisionState([], { approvalsNeeded: 0, rejectNeedsModerator: true })
		).toThrow(ReviewPolicyError);
	});
});

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mailSettled } from '../mail/send';
import { and, eq } from 'drizzle-orm';
import { createAccount } from '../accounts/accounts';
import { toSessionUser, type SessionUser } from '../accounts/auth';
import { db } from '../db';
import { auditLog, designs, mailQueue, reviews, users, type Role } from '../db/schema';
import { createDesign, starterContent } from '../designs/designs';
import { getDesignBySlug, getRevision, getRevisionById, listRevisions } from '../designs/lookups';
import { startRevision, submitRevision, withdrawRevision } from '../designs/revisions';
import {
	confirmableRejects,
	confirmReject,
	listQueue,
	reviewsPanelData,
	submitReview
} from './reviews';
import { DomainError } from '../http/errors';

let author: SessionUser;
let tomas: SessionUser;
let ines: SessionUser;
let wren: SessionUser;
let plain: SessionUser;

async function person(email: string, role: Role) {
	const a = (await createAccount({
		email,
		displayName: email.split('@')[0],
		password: 'long enough pass'
	}))!;
	db.update(users).set({ emailVerifiedAt: new Date(), role }).where(eq(users.id, a.id)).run();
	return toSessionUser(db.select().from(users).where(eq(users.id, a.id)).get()!);
}

function status(fn: () => unknown): number {
	try {
		fn();
	} catch (e) {
		expect(e).toBeInstanceOf(DomainError);
		return (e as DomainError).status;
	}
	return 200;
}

let n = 0;
/** A fresh design with r1 submitted; returns its slug and r1's id. */
function submitted(family: 'dipole' | 'patch' = 'dipole') {
	n++;
	const { slug, revisionId } = createDesign(
		author,
		{ title: `Review test ${n}`, family, polarization: 'linear', summary: '' },
		{ ...starterContent(868e6), notes: 'one\ntwo' }
	);
	submitRevision(author, revisionId, new Date(Date.UTC(2026, 0, n)));
	return { slug, id: revisionId };
}

const stateOf = (id: string) => getRevisionById(id)!.state;
const ok = (summary = 'Checked the table against my own build.') => ({
	verdict: 'approve',
	summary
});

// Notices are sent in the background: let them finish before this file's database goes.
afterAll(mailSettled);

beforeAll(async () => {
	author = await person('rev-author@example.org', 'member');
	tomas = await person('rev-tomas@example.org', 'reviewer');
	ines = await person('rev-ines@example.org', 'reviewer');
	wren = await person('rev-wren@example.org', 'moderator');
	await person('rev-wren2@example.org', 'moderator');
	plain = await person('rev-plain@example.org', 'member');
});

describe('verdicts and the approval policy', () => {
	it('one approve approves the revision, makes it the shown revision, and audits both', () => {
		const { slug, id } = submitted();
		const result = submitReview(tomas, id, ok());
		expect(result.state).toBe('approved');
		expect(stateOf(id)).toBe('approved');
		expect(getRevisionById(id)!.decidedAt).not.toBeNull();
		expect(getDesignBySlug(slug)!.shownRevisionId).toBe(id);
		const actions = db
			.select()
			.from(auditLog)
			.where(eq(auditLog.targetId, id))
			.all()
			.map((a) => a.action);
		expect(actions).toEqual(expect.arrayContaining(['review.submit', 'revision.approve']));
	});

	it('revise returns the revision; the author starts r2 from it and r1 stays readable', () => {
		const { slug, id } = submitted();
		expect(
			submitReview(ines, id, { verdict: 'revise', summary: 'The feed gap is too wide.' }).state
		).toBe('returned');
		expect(stateOf(id)).toBe('returned');
		const design = getDesignBySlug(slug)!;
		expect(design.shownRevisionId).toBeNull();
		const r2 = startRevision(author, design);
		expect(r2.number).toBe(2);
		expect(r2.notes).toBe('one\ntwo');
		// A returned revision takes no more verdicts.
		expect(status(() => submitReview(tomas, id, ok()))).toBe(409);
	});

	it('an approved newer revision replaces the shown one; the older approved one stays approved', () => {
		const { slug, id } = submitted();
		submitReview(tomas, id, ok());
		const design = getDesignBySlug(slug)!;
		const r2 = startRevision(author, design);
		submitRevision(author, r2.id);
		submitReview(ines, r2.id, ok());
		expect(getDesignBySlug(slug)!.shownRevisionId).toBe(r2.id);
		expect(stateOf(id)).toBe('approved');
	});

	it('refuses the author, plain members, withdrawn (409) and drafts (404)', () => {
		const { slug, id } = submitted();
		expect(status(() => submitReview(author, id, ok()))).toBe(403);
		expect(status(() => submitReview(plain, id, ok()))).toBe(403);
		expect(status(() => submitReview(tomas, id, { verdict: 'approve', summary: '   ' }))).toBe(422);
		expect(status(() => submitReview(tomas, id, { verdict: 'maybe', summary: 'hm' }))).toBe(422);
		withdrawRevision(author, id);
		expect(status(() => submitReview(tomas, id, ok()))).toBe(409);
		const draft = startRevision(author, getDesignBySlug(slug)!);
		expect(status(() => submitReview(tomas, draft.id, ok()))).toBe(404);
		expect(db.select().from(reviews).where(eq(reviews.revisionId, id)).all()).toHaveLength(0);
	});

	it('a reviewer who is also the author of the revision cannot review it', async () => {
		const reviewerAuthor = await person('rev-self@example.org', 'reviewer');
		const { revisionId } = createDesign(
			reviewerAuthor,
			{ title: 'Self review', family: 'dipole', polarization: 'linear', summary: '' },
			starterContent(868e6)
		);
		submitRevision(reviewerAuthor, revisionId);
		expect(status(() => submitReview(reviewerAuthor, revisionId, ok()))).toBe(403);
		expect(listQueue(reviewerAuthor).some((q) => q.title === 'Self review')).toBe(false);
	});

	it('reject waits for a moderator; confirmed, the revision is returned with the reject on record', () => {
		const { id } = submitted();
		const r = submitReview(tomas, id, {
			verdict: 'reject',
			summary: 'Measured VSWR never below 3.'
		});
		expect(r.state).toBe('reject_pending');
		expect(stateOf(id)).toBe('submitted');
		// Another reviewer's approve does not outvote a pending reject.
		expect(submitReview(ines, id, ok()).state).toBe('reject_pending');
		const rejectId = db
			.select()
			.from(reviews)
			.where(and(eq(reviews.revisionId, id), eq(reviews.verdict, 'reject')))
			.get()!.id;
		expect(status(() => confirmReject(tomas, rejectId))).toBe(403);
		confirmReject(wren, rejectId);
		expect(stateOf(id)).toBe('returned');
		expect(db.select().from(reviews).where(eq(reviews.id, rejectId)).get()!.confirmedById).toBe(
			wren.id
		);
		expect(status(() => confirmReject(wren, rejectId))).toBe(409);
		const actions = db
			.select()
			.from(auditLog)
			.all()
			.map((a) => a.action);
		expect(actions).toContain('review.reject_confirm');
	});

	it('a rejection needs a second person: the moderator who gave it cannot confirm it', () => {
		const { id } = submitted();
		expect(
			submitReview(wren, id, { verdict: 'reject', summary: 'Measured VSWR never below 3.' }).state
		).toBe('reject_pending');
		const rejectId = db
			.select()
			.from(reviews)
			.where(and(eq(reviews.revisionId, id), eq(reviews.verdict, 'reject')))
			.get()!.id;
		expect(status(() => confirmReject(wren, rejectId))).toBe(403);
		expect(stateOf(id)).toBe('submitted');
		const other = toSessionUser(
			db.select().from(users).where(eq(users.email, 'rev-wren2@example.org')).get()!
		);
		// The review page offers the confirm button only to the second moderator.
		const r = getRevisionById(id)!;
		const design = db.select().from(designs).where(eq(designs.id, r.designId)).get()!;
		expect(confirmableRejects(r, design, wren)).toEqual([]);
		expect(confirmableRejects(r, design, other).map((v) => v.id)).toEqual([rejectId]);
		confirmReject(other, rejectId);
		expect(stateOf(id)).toBe('returned');
	});

	it('a moderator cannot confirm a rejection on a design they own or wrote', async () => {
		const modAuthor = await person('rev-mod-author@example.org', 'moderator');
		const { revisionId } = createDesign(
			modAuthor,
			{ title: 'Moderator design', family: 'dipole', polarization: 'linear', summary: '' },
			starterContent(868e6)
		);
		submitRevision(modAuthor, revisionId);
		submitReview(tomas, revisionId, { verdict: 'reject', summary: 'Wrong band.' });
		const rejectId = db.select().from(reviews).where(eq(reviews.revisionId, revisionId)).get()!.id;
		expect(status(() => confirmReject(modAuthor, rejectId))).toBe(403);
		expect(status(() => submitReview(modAuthor, revisionId, ok()))).toBe(403);
		expect(stateOf(revisionId)).toBe('submitted');
	});

	it('a reviewer may change their verdict while the revision waits; the latest counts', () => {
		const { id } = submitted();
		submitReview(tomas, id, { verdict: 'reject', summary: 'Wrong band.' });
		expect(submitReview(tomas, id, ok('Sorry, my mistake: right band.')).state).toBe('approved');
	});

	it('an approve does not pass a policy that asks for two reviewers', () => {
		const { id } = submitted();
		const policy = { approvalsNeeded: 2, rejectNeedsModerator: true };
		expect(submitReview(tomas, id, ok(), { policy }).state).toBe('submitted');
		expect(stateOf(id)).toBe('submitted');
		expect(submitReview(ines, id, ok(), { policy }).state).toBe('approved');
	});

	it('mails the author on each review, with a link to the review', () => {
		const { slug, id } = submitted();
		const before = db
			.select()
			.from(mailQueue)
			.where(eq(mailQueue.toAddress, author.email))
			.all().length;
		submitReview(tomas, id, { verdict: 'revise', summary: 'Please add the balun length.' });
		const mails = db.select().from(mailQueue).where(eq(mailQueue.toAddress, author.email)).all();
		expect(mails).toHaveLength(before + 1);
		expect(mails.at(-1)!.body).toContain(`/review/${slug}/1#review-`);
		expect(mails.at(-1)!.body).toContain('Please add the balun length.');
	});
});

describe('queue', () => {
	it('lists submitted revisions oldest first with review counts, filtered by family, band and mine', () => {
		const a = submitted('patch');
		const b = submitted('patch');
		submitReview(ines, b.id, { verdict: 'reject', summary: 'No.' });
		const q = listQueue(tomas, { family: 'patch' });
		const titles = q.map((x) => x.slug);
		expect(titles.indexOf(a.slug)).toBeLessThan(titles.indexOf(b.slug));
		expect(q.find((x) => x.slug === b.slug)).toMatchObject({ reviewCount: 1, rejectPending: true });
		expect(q.every((x) => x.family === 'patch')).toBe(true);
		expect(listQueue(tomas, { band: 'ism-2g4' }).some((x) => x.slug === a.slug)).toBe(false);
		expect(listQueue(ines, { mine: true }).map((x) => x.slug)).toEqual([b.slug]);
		expect(listQueue(author).some((x) => x.slug === a.slug || x.slug === b.slug)).toBe(false);
	});

	it('the design page panel lists reviews and flags a pending reject', () => {
		const { slug, id } = submitted();
		submitReview(tomas, id, { verdict: 'reject', summary: 'No.' });
		const design = db.select().from(designs).where(eq(designs.slug, slug)).get()!;
		const history = listRevisions(design.id);
		const panel = reviewsPanelData(getRevision(design.id, 1)!, author, history).reviewsPanel;
		expect(panel.reviews.map((r) => r.verdict)).toEqual(['reject']);
		expect(panel.rejectPending).toBe(true);
		expect(panel.canOpenReview).toBe(true);
		expect(panel.previousNumber).toBeNull();
		expect(
			reviewsPanelData(getRevision(design.id, 1)!, plain, history).reviewsPanel.canOpenReview
		).toBe(false);
	});
});

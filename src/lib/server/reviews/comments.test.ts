import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mailSettled } from '../mail/send';
import { eq } from 'drizzle-orm';
import { JSDOM } from 'jsdom';
import { createAccount } from '../accounts/accounts';
import { toSessionUser, type SessionUser } from '../accounts/auth';
import { db } from '../db';
import { comments, mailQueue, users, type Role } from '../db/schema';
import { createDesign, starterContent } from '../designs/designs';
import { getDesignBySlug } from '../designs/lookups';
import { startRevision, submitRevision, withdrawRevision } from '../designs/revisions';
import { getRevisionById } from '../designs/lookups';
import { addComment, listThreads, MAX_COMMENT_CHARS, setResolved } from './comments';
import { DomainError } from '../http/errors';
import { XSS_VECTORS } from '../../testing/xss-corpus';

let author: SessionUser;
let tomas: SessionUser;
let ines: SessionUser;
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

function failure(fn: () => unknown): DomainError {
	try {
		fn();
	} catch (e) {
		expect(e).toBeInstanceOf(DomainError);
		return e as DomainError;
	}
	throw new Error('expected a DomainError');
}

let n = 0;
function submitted() {
	n++;
	const { slug, revisionId } = createDesign(
		author,
		{ title: `Comment test ${n}`, family: 'dipole', polarization: 'linear', summary: '' },
		{ ...starterContent(868e6), notes: 'Line one.\nLine two.\nLine three.' }
	);
	submitRevision(author, revisionId);
	return { slug, id: revisionId };
}

// Notices are sent in the background: let them finish before this file's database goes.
afterAll(mailSettled);

beforeAll(async () => {
	author = await person('c-author@example.org', 'member');
	tomas = await person('c-tomas@example.org', 'reviewer');
	ines = await person('c-ines@example.org', 'reviewer');
	plain = await person('c-plain@example.org', 'member');
});

describe('anchors', () => {
	it('anchors to a row key, a line range or nothing, and checks both against the revision', () => {
		const { id } = submitted();
		addComment(tomas, id, { body: 'Row', anchor: { kind: 'row', rowKey: 'quarter_wave' } });
		addComment(tomas, id, { body: 'Lines', anchor: { kind: 'lines', start: 2, end: 3 } });
		addComment(tomas, id, { body: 'General' });
		const threads = listThreads(getRevisionById(id)!, tomas);
		expect(threads.map((t) => t.anchor)).toEqual([
			{ kind: 'row', rowKey: 'quarter_wave' },
			{ kind: 'lines', start: 2, end: 3 },
			{ kind: 'general' }
		]);
		const noRow = failure(() =>
			addComment(tomas, id, { body: 'x', anchor: { kind: 'row', rowKey: 'no_such_row' } })
		);
		expect([noRow.status, noRow.field]).toEqual([422, 'row_key']);
		expect(noRow.message).toContain('no_such_row');
		expect(
			failure(() =>
				addComment(tomas, id, { body: 'x', anchor: { kind: 'lines', start: 3, end: 4 } })
			).status
		).toBe(422);
		expect(
			failure(() =>
				addComment(tomas, id, { body: 'x', anchor: { kind: 'lines', start: 3, end: 2 } })
			).status
		).toBe(422);
		expect(
			failure(() =>
				addComment(tomas, id, { body: 'x', anchor: { kind: 'lines', start: NaN, end: NaN } })
			).status
		).toBe(422);
		expect(db.select().from(comments).where(eq(comments.revisionId, id)).all()).toHaveLength(3);
	});

	it('refuses empty and huge comments with a clear message', () => {
		const { id } = submitted();
		expect(failure(() => addComment(tomas, id, { body: '  ' })).status).toBe(422);
		const huge = failure(() => addComment(tomas, id, { body: 'a'.repeat(MAX_COMMENT_CHARS + 1) }));
		expect(huge.status).toBe(422);
		expect(huge.message).toContain('20,000');
		expect(addComment(tomas, id, { body: 'a'.repeat(MAX_COMMENT_CHARS) }).id).toBeTruthy();
	});
});

describe('who may comment', () => {
	it('403 on a draft that is not yours, 409 on your own draft and on a withdrawn revision', () => {
		const { slug, id } = submitted();
		const draft = startRevision(author, getDesignBySlug(slug)!);
		expect(failure(() => addComment(tomas, draft.id, { body: 'peek' })).status).toBe(403);
		expect(failure(() => addComment(author, draft.id, { body: 'note to self' })).status).toBe(409);
		expect(failure(() => addComment(plain, id, { body: 'drive-by' })).status).toBe(403);
		withdrawRevision(author, id);
		expect(failure(() => addComment(tomas, id, { body: 'late' })).status).toBe(409);
	});
});

describe('threads', () => {
	it('replies join the thread and take its anchor; a reply to a reply joins the same thread', () => {
		const { id } = submitted();
		const root = addComment(tomas, id, {
			body: 'Check this row.',
			anchor: { kind: 'row', rowKey: 'quarter_wave' }
		});
		const reply = addComment(author, id, { body: 'Fixed in r2.', parentId: root.id });
		addComment(ines, id, { body: 'Agreed.', parentId: reply.id });
		const [thread] = listThreads(getRevisionById(id)!, author);
		expect(thread.anchor).toEqual({ kind: 'row', rowKey: 'quarter_wave' });
		expect(thread.replies.map((r) => r.authorName)).toEqual(['c-author', 'c-ines']);
		expect(thread.replies[0].isAuthorOfRevision).toBe(true);
		expect(failure(() => addComment(tomas, id, { body: 'x', parentId: 'nope' })).status).toBe(404);
	});

	it('the thread starter or the revision author may resolve; nobody else; replies are not resolved alone', () => {
		const { id } = submitted();
		const root = addComment(tomas, id, { body: 'Resolve me.' });
		const reply = addComment(author, id, { body: 'Done.', parentId: root.id });
		expect(failure(() => setResolved(ines, root.id, true)).status).toBe(403);
		expect(failure(() => setResolved(author, reply.id, true)).status).toBe(409);
		setResolved(author, root.id, true);
		let [thread] = listThreads(getRevisionById(id)!, tomas);
		expect([thread.resolved, thread.resolvedBy, thread.canResolve]).toEqual([
			true,
			'c-author',
			true
		]);
		setResolved(tomas, root.id, false);
		[thread] = listThreads(getRevisionById(id)!, ines);
		expect([thread.resolved, thread.canResolve]).toEqual([false, false]);
	});

	it('mails the author on a reviewer comment and the starter on a reply, with the comment anchor link', () => {
		const { slug, id } = submitted();
		const count = (to: string) =>
			db.select().from(mailQueue).where(eq(mailQueue.toAddress, to)).all();
		const a0 = count(author.email).length;
		const t0 = count(tomas.email).length;
		const root = addComment(tomas, id, { body: 'Which coax?' });
		expect(count(author.email)).toHaveLength(a0 + 1);
		expect(count(author.email).at(-1)!.body).toContain(`/review/${slug}/1#comment-${root.id}`);
		const reply = addComment(author, id, { body: 'RG-402.', parentId: root.id });
		expect(count(tomas.email)).toHaveLength(t0 + 1);
		expect(count(tomas.email).at(-1)!.body).toContain(`#comment-${reply.id}`);
		// The author writing gets no mail about their own words.
		expect(count(author.email)).toHaveLength(a0 + 1);
	});
});

describe('stored comments render sanitized', () => {
	it('no vector from the XSS corpus leaves script, handlers or javascript: URLs', () => {
		const { id } = submitted();
		for (const v of XSS_VECTORS) addComment(tomas, id, { body: v }, { notify: false });
		const threads = listThreads(getRevisionById(id)!, tomas);
		expect(threads).toHaveLength(XSS_VECTORS.length);
		const doc = new JSDOM(`<body>${threads.map((t) => `<div>${t.html}</div>`).join('')}</body>`)
			.window.document;
		expect(
			doc.querySelectorAll('script, iframe, object, embed, svg, math, form, input, style')
		).toHaveLength(0);
		for (const el of Array.from(doc.querySelectorAll('*'))) {
			for (const attr of Array.from(el.attributes)) {
				expect(attr.name.startsWith('on'), `${el.tagName} ${attr.name}`).toBe(false);
				if (attr.name === 'href' || attr.name === 'src') {
					expect(attr.value.replace(/[\s\u0000-\u001f]/g, '')).not.toMatch(
						/^(javascript|vbscript|data):/i
					);
				}
			}
		}
	});
});

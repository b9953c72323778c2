import { beforeAll, beforeEach, describe, expect, it, vi } from 'vitest';
import type { RequestEvent } from '@sveltejs/kit';
import { sqlite } from '../db';
import { SESSION_COOKIE, type SessionUser } from '../accounts/auth';
import { clearPageCache, currentStamp, pageCache, pageCacheSize } from './page-cache';
import { createDesign, starterContent } from '../designs/designs';
import { getDesignBySlug } from '../designs/lookups';
import { startRevision, submitRevision } from '../designs/revisions';
import { setRole } from '../accounts/users';
import { member } from '../../testing/server-setup';

// Tables whose rows some public page shows: a write to any of them must move the stamp on.
const SHOWN = [
	'users',
	'designs',
	'revisions',
	'reviews',
	'comments',
	'measurements',
	'attachments',
	'retirements'
];
// Tables no public page reads.
const NOT_SHOWN = [
	'sessions',
	'email_tokens',
	'audit_log',
	'mail_queue',
	'page_stamp',
	'__drizzle_migrations'
];

describe('page stamp triggers', () => {
	it('every table is either stamped or known not to be shown (a new table must be placed)', () => {
		const tables = sqlite
			.prepare(
				"SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' AND name NOT LIKE 'design_search%'"
			)
			.pluck()
			.all() as string[];
		expect([...tables].sort()).toEqual([...SHOWN, ...NOT_SHOWN].sort());
	});

	it('each shown table has an insert, update and delete trigger that moves the stamp', () => {
		const rows = sqlite
			.prepare(
				"SELECT tbl_name, sql FROM sqlite_master WHERE type = 'trigger' AND sql LIKE '%page_stamp%'"
			)
			.all() as { tbl_name: string; sql: string }[];
		for (const table of SHOWN) {
			for (const op of ['INSERT', 'UPDATE', 'DELETE']) {
				const found = rows.filter((r) => r.tbl_name === table && r.sql.includes(`AFTER ${op} ON`));
				expect(found, `${op} trigger on ${table}`).toHaveLength(1);
				expect(found[0].sql).toContain('stamp = stamp + 1');
			}
		}
		expect(rows.filter((r) => NOT_SHOWN.includes(r.tbl_name))).toEqual([]);
	});

	it('authoring, submitting and a role change each move the stamp; a session does not', async () => {
		const before = currentStamp();
		const author = await member('stamp-author@example.org');
		const afterAccount = currentStamp();
		expect(afterAccount).toBeGreaterThan(before);

		const { revisionId } = createDesign(
			author,
			{ title: 'Stamp test', family: 'biquad', polarization: 'linear', summary: '' },
			starterContent(2.45e9)
		);
		const afterCreate = currentStamp();
		expect(afterCreate).toBeGreaterThan(afterAccount);
		submitRevision(author, revisionId);
		const afterSubmit = currentStamp();
		expect(afterSubmit).toBeGreaterThan(afterCreate);
		setRole(null, author.id, 'reviewer');
		expect(currentStamp()).toBeGreaterThan(afterSubmit);

		const s = currentStamp();
		sqlite
			.prepare(
				"INSERT INTO mail_queue (to_address, subject, body, next_attempt_at, created_at) VALUES ('a@b.c', 's', 'b', 0, 0)"
			)
			.run();
		expect(currentStamp()).toBe(s);
	});
});

// A stand-in for SvelteKit's event: only what the hook reads.
function event(
	path: string,
	opts: { route?: string | null; method?: string; cookie?: string; data?: boolean } = {}
) {
	const url = new URL(`http://127.0.0.1${path}`);
	return {
		url,
		request: new Request(url, { method: opts.method ?? 'GET' }),
		route: { id: opts.route === undefined ? '/designs/[slug]' : opts.route },
		isDataRequest: opts.data ?? false,
		isSubRequest: false,
		cookies: { get: (name: string) => (name === SESSION_COOKIE ? opts.cookie : undefined) }
	} as unknown as RequestEvent;
}

let renders = 0;
function renderer(status = 200, headers: Record<string, string> = {}) {
	return vi.fn(async () => {
		renders += 1;
		return new Response(`<p>render ${renders}</p>`, {
			status,
			headers: { 'content-type': 'text/html', ...headers }
		});
	});
}
const text = async (r: Response) => r.text();

describe('pageCache hook', () => {
	let author: SessionUser;
	beforeAll(async () => {
		author = await member('cache-author@example.org');
	});
	beforeEach(() => clearPageCache());

	const ask = (path: string, resolve: ReturnType<typeof renderer>, opts = {}) =>
		pageCache({ event: event(path, opts), resolve });

	it('keeps a page from its second request on, the same bytes until a write moves the stamp', async () => {
		const resolve = renderer();
		await ask('/designs/x?f=5.8e9', resolve);
		expect(pageCacheSize().entries).toBe(0); // asked once: not kept
		const second = await text(await ask('/designs/x?f=5.8e9', resolve));
		expect(pageCacheSize().entries).toBe(1);
		const third = await text(await ask('/designs/x?f=5.8e9', resolve));
		expect(third).toBe(second);
		expect(resolve).toHaveBeenCalledTimes(2);

		// Another query string is another page.
		await ask('/designs/x?f=2.4e9', resolve);
		expect(resolve).toHaveBeenCalledTimes(3);

		const { revisionId } = createDesign(
			author,
			{ title: 'Cache test', family: 'biquad', polarization: 'linear', summary: '' },
			starterContent(5.8e9)
		);
		const fourth = await text(await ask('/designs/x?f=5.8e9', resolve));
		expect(resolve).toHaveBeenCalledTimes(4);
		expect(fourth).not.toBe(second);
		// Kept again at once (the key was asked for before), until the next write.
		expect(await text(await ask('/designs/x?f=5.8e9', resolve))).toBe(fourth);
		expect(resolve).toHaveBeenCalledTimes(4);

		submitRevision(author, revisionId);
		startRevision(author, getDesignBySlug('cache-test')!);
		await ask('/designs/x?f=5.8e9', resolve);
		expect(resolve).toHaveBeenCalledTimes(5);
	});

	it('keeps the headers of the render, and gives every copy a CSP nonce of its own in header and page', async () => {
		const resolve = vi.fn(async () => {
			renders += 1;
			const n = 'RenderNonce+/0123456789==';
			return new Response(`<script nonce="${n}">start()</script><link nonce="${n}">`, {
				headers: {
					'content-type': 'text/html',
					'x-extra': 'kept',
					etag: '"abc"',
					'content-security-policy': `script-src 'self' 'nonce-${n}'; style-src 'self'`
				}
			});
		});
		await ask('/designs/y', resolve);
		await ask('/designs/y', resolve);
		const nonces = new Set<string>();
		for (let i = 0; i < 3; i++) {
			const hit = await ask('/designs/y', resolve);
			const html = await hit.text();
			const inHeader = /'nonce-([^']+)'/.exec(hit.headers.get('content-security-policy')!)![1];
			expect(html).toBe(`<script nonce="${inHeader}">start()</script><link nonce="${inHeader}">`);
			expect(hit.headers.get('content-security-policy')).toBe(
				`script-src 'self' 'nonce-${inHeader}'; style-src 'self'`
			);
			expect(hit.headers.get('content-length')).toBe(String(Buffer.byteLength(html)));
			expect(hit.headers.get('x-extra')).toBe('kept');
			expect(hit.headers.get('etag')).toBeNull();
			nonces.add(inHeader);
		}
		expect(resolve).toHaveBeenCalledTimes(2);
		expect(nonces.size).toBe(3);
		expect(nonces.has('RenderNonce+/0123456789==')).toBe(false);
	});

	it('never keeps pages for signed-in readers, other methods, data requests or other routes', async () => {
		const cases = [
			event('/designs/z', { cookie: 'token' }),
			event('/designs/z', { method: 'POST' }),
			event('/designs/z/__data.json', { data: true }),
			event('/designs', { route: '/designs' }),
			event('/nowhere', { route: null })
		];
		for (const e of cases) {
			const resolve = renderer();
			for (let i = 0; i < 3; i++) await pageCache({ event: e, resolve });
			expect(resolve, e.url.pathname).toHaveBeenCalledTimes(3);
		}
		expect(pageCacheSize().entries).toBe(0);
	});

	it('never keeps a response that sets a cookie or is not a 200', async () => {
		for (const resolve of [renderer(404), renderer(200, { 'set-cookie': 'a=b' })]) {
			for (let i = 0; i < 3; i++) await ask('/designs/w', resolve);
			expect(resolve).toHaveBeenCalledTimes(3);
		}
		expect(pageCacheSize().entries).toBe(0);
	});

	it('stays within its entry bound, dropping the least recently used page first', async () => {
		const resolve = renderer();
		for (let i = 0; i < 1005; i++) {
			await ask(`/designs/p?f=${i}`, resolve);
			await ask(`/designs/p?f=${i}`, resolve);
		}
		expect(pageCacheSize().entries).toBe(1000);
		expect(resolve).toHaveBeenCalledTimes(2010);
		await ask('/designs/p?f=0', resolve); // dropped: rendered again
		expect(resolve).toHaveBeenCalledTimes(2011);
		await ask('/designs/p?f=1004', resolve); // kept
		expect(resolve).toHaveBeenCalledTimes(2011);
	});
});

import { randomBytes } from 'node:crypto';
import type { Handle, RequestEvent } from '@sveltejs/kit';
import { sqlite } from '../db';
import { SESSION_COOKIE } from '../accounts/auth';
import { LRUCache } from 'lru-cache';
import { Doorkeeper } from './doorkeeper';

/**
 * Design pages as a reader without a session sees them, kept in memory. An entry is the response
 * a render gave (its bytes and headers, less its ETag), remembered with the page stamp it was rendered at; any write to what a
 * public page shows moves the stamp on (triggers in drizzle/0004_page_stamp.sql, from this process
 * or any other), and an entry with an older stamp is rendered again. A page is kept from the second
 * time it is asked for; each copy served gets a fresh CSP nonce. Signed-in readers, form posts,
 * client-side data requests and any response that sets a cookie or is not a 200 are never kept.
 */
const CACHED_ROUTES: ReadonlySet<string> = new Set(['/designs/[slug]', '/designs/[slug]/r/[n]']);

/** Bounds: a 40-row design page is about 50 kB. */
const MAX_ENTRIES = 1000;
const MAX_BYTES = 48 * 1024 * 1024;

interface Entry {
	stamp: number;
	/** The page's bytes split where its CSP nonce stood; a served copy gets a fresh nonce there. */
	parts: Buffer[];
	bytes: number;
	headers: [string, string][];
	/** The content-security-policy header split the same way. */
	csp: string[];
}

// Least recently used pages go first, by count and by size; a page over an eighth of it is not kept.
const entries = new LRUCache<string, Entry>({
	max: MAX_ENTRIES,
	maxSize: MAX_BYTES,
	maxEntrySize: MAX_BYTES / 8,
	sizeCalculation: (e) => e.bytes
});
// A page is kept from its second request on: pages asked for once cost no memory.
let asked = new Doorkeeper(4 * MAX_ENTRIES);

const stampQuery = sqlite.prepare('SELECT stamp FROM page_stamp WHERE id = 1').pluck();

export function currentStamp(): number {
	return stampQuery.get() as number;
}

function cacheable(event: RequestEvent): boolean {
	return (
		event.request.method === 'GET' &&
		!event.isDataRequest &&
		!event.isSubRequest &&
		event.route.id !== null &&
		CACHED_ROUTES.has(event.route.id) &&
		event.cookies.get(SESSION_COOKIE) === undefined
	);
}

export const pageCache: Handle = async ({ event, resolve }) => {
	if (!cacheable(event)) return resolve(event);
	const key = event.url.pathname + event.url.search;
	// Read before rendering: a write during the render leaves the entry already out of date.
	const stamp = currentStamp();
	const hit = entries.get(key);
	if (hit && hit.stamp === stamp) return serve(hit);
	const response = await resolve(event);
	if (response.status !== 200 || response.headers.has('set-cookie') || !response.body)
		return response;
	if (!asked.seen(key)) return response;
	const html = await response.text();
	const entry = keep(html, response.headers, stamp);
	entries.set(key, entry);
	return new Response(html, { status: 200, headers: response.headers });
};

/**
 * A page as kept: split at its CSP nonce (SvelteKit's nonce mode gives every render its own), so
 * every served copy carries a nonce of its own, as a render would. The ETag goes: with a nonce per
 * response it could never match anyway.
 */
function keep(html: string, responseHeaders: Headers, stamp: number): Entry {
	const header = responseHeaders.get('content-security-policy') ?? '';
	const nonce = /'nonce-([^']+)'/.exec(header)?.[1];
	const parts = (nonce ? html.split(nonce) : [html]).map((p) => Buffer.from(p));
	const headers = [...responseHeaders].filter(
		([name]) => name !== 'etag' && name !== 'content-security-policy' && name !== 'content-length'
	);
	return {
		stamp,
		parts,
		bytes: parts.reduce((n, p) => n + p.byteLength, 0),
		headers,
		csp: nonce ? header.split(nonce) : header ? [header] : []
	};
}

function serve(entry: Entry): Response {
	// As SvelteKit makes them: 16 random bytes in base64.
	const nonce = Buffer.from(randomBytes(16).toString('base64'));
	const chunks: Buffer[] = [];
	entry.parts.forEach((p, i) => (i === 0 ? chunks.push(p) : chunks.push(nonce, p)));
	const headers = new Headers(entry.headers);
	if (entry.csp.length) headers.set('content-security-policy', entry.csp.join(nonce.toString()));
	const body = Buffer.concat(chunks);
	headers.set('content-length', String(body.byteLength));
	return new Response(body, { status: 200, headers });
}

/** For tests: how many pages are kept and their total size. */
export function pageCacheSize(): { entries: number; bytes: number } {
	return { entries: entries.size, bytes: entries.calculatedSize };
}

export function clearPageCache(): void {
	entries.clear();
	asked = new Doorkeeper(4 * MAX_ENTRIES);
}

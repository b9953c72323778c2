import type { Handle, RequestEvent } from '@sveltejs/kit';
import { sqlite } from './db';
import { SESSION_COOKIE } from './auth';
import { Doorkeeper } from './lru';

/**
 * Design pages as a reader without a session sees them, kept in memory. An entry is the exact
 * response a render gave, remembered with the page stamp it was rendered at; any write to what a
 * public page shows moves the stamp on (triggers in drizzle/0004_page_stamp.sql, from this process
 * or any other), and an entry with an older stamp is rendered again. A page is kept from the second
 * time it is asked for. Signed-in readers, form posts,
 * client-side data requests and any response that sets a cookie or is not a 200 are never kept.
 */
export const CACHED_ROUTES: ReadonlySet<string> = new Set(['/designs/[slug]', '/designs/[slug]/r/[n]']);

/** Bounds: a 40-row design page is about 50 kB. */
const MAX_ENTRIES = 1000;
const MAX_BYTES = 48 * 1024 * 1024;

interface Entry {
	stamp: number;
	body: Uint8Array<ArrayBuffer>;
	headers: [string, string][];
}

const entries = new Map<string, Entry>();
// A page is kept from its second request on: pages asked for once cost no memory.
let asked = new Doorkeeper(4 * MAX_ENTRIES);
let bytes = 0;

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

function forget(key: string): void {
	const old = entries.get(key);
	if (old) {
		entries.delete(key);
		bytes -= old.body.byteLength;
	}
}

function remember(key: string, entry: Entry): void {
	forget(key);
	if (entry.body.byteLength > MAX_BYTES / 8) return;
	entries.set(key, entry);
	bytes += entry.body.byteLength;
	// Map order is insertion order and a hit re-inserts, so the first key is the least recently used.
	for (const oldest of entries.keys()) {
		if (entries.size <= MAX_ENTRIES && bytes <= MAX_BYTES) break;
		forget(oldest);
	}
}

export const pageCache: Handle = async ({ event, resolve }) => {
	if (!cacheable(event)) return resolve(event);
	const key = event.url.pathname + event.url.search;
	// Read before rendering: a write during the render leaves the entry already out of date.
	const stamp = currentStamp();
	const hit = entries.get(key);
	if (hit && hit.stamp === stamp) {
		entries.delete(key);
		entries.set(key, hit);
		return new Response(hit.body, { status: 200, headers: hit.headers });
	}
	const response = await resolve(event);
	if (response.status !== 200 || response.headers.has('set-cookie') || !response.body) return response;
	if (!asked.seen(key)) return response;
	const body = new Uint8Array(await response.arrayBuffer());
	const headers = [...response.headers];
	remember(key, { stamp, body, headers });
	return new Response(body, { status: 200, headers });
};

/** For tests: how many pages are kept and their total size. */
export function pageCacheSize(): { entries: number; bytes: number } {
	return { entries: entries.size, bytes };
}

export function clearPageCache(): void {
	entries.clear();
	bytes = 0;
	asked = new Doorkeeper(4 * MAX_ENTRIES);
}

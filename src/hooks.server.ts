import { sequence } from '@sveltejs/kit/hooks';
import type { Handle, HandleServerError } from '@sveltejs/kit';
import { building, dev } from '$app/environment';
import {
	SESSION_COOKIE,
	clearSessionCookie,
	setSessionCookie,
	validateSessionToken
} from '$lib/server/accounts/auth';
import { sqlite } from '$lib/server/db';
import {
	BUSY_MESSAGE,
	BUSY_TIMEOUT_MS,
	busyResponse,
	DatabaseBusyError,
	isBusy,
	RETRY_AFTER_SECONDS,
	retryBusy
} from '$lib/server/db/busy';
import { startMailWorker, warnAboutMail } from '$lib/server/mail/send';
import { pageCache } from '$lib/server/http/page-cache';
import { blobKeysInUse } from '$lib/server/measurements/blob-keys';
import { sweepStore } from '$lib/server/storage/sweep';

export const init = async () => {
	// Waiting for another writer blocks the event loop: wait briefly, retry without blocking (db/busy.ts).
	sqlite.pragma(`busy_timeout = ${BUSY_TIMEOUT_MS}`);
	warnAboutMail();
	// Before serving, so no upload of this process is in flight: what a crash left goes now.
	if (!building)
		await sweepStore(blobKeysInUse).catch((e) =>
			console.error('storage sweep failed; the server starts anyway', e)
		);
	startMailWorker();
};

const requestId: Handle = ({ event, resolve }) => {
	event.locals.requestId = crypto.randomUUID();
	return resolve(event);
};

const session: Handle = async ({ event, resolve }) => {
	event.locals.user = null;
	event.locals.session = null;
	const token = event.cookies.get(SESSION_COOKIE);
	if (token) {
		// Validation writes now and then (an hourly refresh, ending an expired session).
		let result: ReturnType<typeof validateSessionToken>;
		try {
			result = await retryBusy(() => validateSessionToken(token));
		} catch (e) {
			if (e instanceof DatabaseBusyError) return busyResponse();
			throw e;
		}
		if (result) {
			event.locals.user = result.user;
			event.locals.session = result.session;
			if (result.refreshed) setSessionCookie(event.cookies, token, result.session, !dev);
		} else {
			clearSessionCookie(event.cookies);
		}
	}
	return resolve(event);
};

/** JSON endpoints that change state check where the request comes from (forms are checked by SvelteKit). */
const apiOrigin: Handle = ({ event, resolve }) => {
	const { request, url } = event;
	if (url.pathname.startsWith('/api/') && !['GET', 'HEAD', 'OPTIONS'].includes(request.method)) {
		const site = request.headers.get('sec-fetch-site');
		const origin = request.headers.get('origin');
		const crossSite = site === 'cross-site' || (origin !== null && origin !== url.origin);
		// Cookie-less calls (scripts, curl) carry no ambient authority; only signed-in calls are guarded.
		if (crossSite && event.cookies.get(SESSION_COOKIE)) {
			return new Response(JSON.stringify({ error: { message: 'Cross-site request refused.' } }), {
				status: 403,
				headers: { 'content-type': 'application/json' }
			});
		}
	}
	return resolve(event);
};

const headers: Handle = async ({ event, resolve }) => {
	let response = await resolve(event);
	// A write that met a lock nobody retried (see handleError) is a 503 too, not a bug.
	if (response.status === 500 && event.locals.busy) {
		response = new Response(response.body, { status: 503, headers: response.headers });
	}
	if (response.status === 503) response.headers.set('retry-after', String(RETRY_AFTER_SECONDS));
	// What depends on the session is never kept by a browser or proxy for the next person.
	if (
		(event.locals.user || response.headers.has('set-cookie')) &&
		!response.headers.has('cache-control')
	) {
		response.headers.set('cache-control', 'private, no-store');
	}
	// A body left unread (an early 413, 415 or 429) stays in the socket, and the next request on this
	// keep-alive connection would fail: read it to its end first. Past BODY_SIZE_LIMIT the read fails,
	// and adapter-node discards the rest itself; either way the connection stays usable.
	if (event.request.body && !event.request.bodyUsed) await drain(event.request.body);
	response.headers.set('x-content-type-options', 'nosniff');
	response.headers.set('referrer-policy', 'strict-origin-when-cross-origin');
	response.headers.set('x-frame-options', 'DENY');
	response.headers.set('permissions-policy', 'camera=(), microphone=(), geolocation=()');
	if (!dev && event.url.protocol === 'https:') {
		response.headers.set('strict-transport-security', 'max-age=31536000; includeSubDomains');
	}
	return response;
};

async function drain(body: ReadableStream<Uint8Array>): Promise<void> {
	const reader = body.getReader();
	try {
		while (!(await reader.read()).done);
	} catch {
		// Over the limit or cut off: nothing more to read.
	}
}

export const handle = sequence(requestId, session, apiOrigin, headers, pageCache);

export const handleError: HandleServerError = ({ error, event, status, message }) => {
	const errorId = event.locals.requestId ?? crypto.randomUUID();
	if (isBusy(error) || error instanceof DatabaseBusyError) {
		event.locals.busy = true;
		return { message: BUSY_MESSAGE, errorId };
	}
	if (status >= 500) {
		console.error(`[${errorId}] ${event.request.method} ${event.url.pathname}`, error);
	}
	return { message: status >= 500 ? 'Something went wrong on our side.' : message, errorId };
};

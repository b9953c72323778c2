import { sequence } from '@sveltejs/kit/hooks';
import type { Handle, HandleServerError } from '@sveltejs/kit';
import { dev } from '$app/environment';
import {
	SESSION_COOKIE,
	clearSessionCookie,
	setSessionCookie,
	validateSessionToken
} from '$lib/server/accounts/auth';
import { startMailWorker } from '$lib/server/mail/send';
import { pageCache } from '$lib/server/http/page-cache';

export const init = async () => {
	startMailWorker();
};

const requestId: Handle = ({ event, resolve }) => {
	event.locals.requestId = crypto.randomUUID();
	return resolve(event);
};

const session: Handle = ({ event, resolve }) => {
	event.locals.user = null;
	event.locals.session = null;
	const token = event.cookies.get(SESSION_COOKIE);
	if (token) {
		const result = validateSessionToken(token);
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
	const response = await resolve(event);
	response.headers.set('x-content-type-options', 'nosniff');
	response.headers.set('referrer-policy', 'strict-origin-when-cross-origin');
	response.headers.set('x-frame-options', 'DENY');
	response.headers.set('permissions-policy', 'camera=(), microphone=(), geolocation=()');
	if (!dev && event.url.protocol === 'https:') {
		response.headers.set('strict-transport-security', 'max-age=31536000; includeSubDomains');
	}
	return response;
};

export const handle = sequence(requestId, session, apiOrigin, headers, pageCache);

export const handleError: HandleServerError = ({ error, event, status, message }) => {
	const errorId = event.locals.requestId ?? crypto.randomUUID();
	if (status >= 500) {
		console.error(`[${errorId}] ${event.request.method} ${event.url.pathname}`, error);
	}
	return { message: status >= 500 ? 'Something went wrong on our side.' : message, errorId };
};

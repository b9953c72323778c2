/**
 * Who counts as the operator for development aids such as the local mail page: a request from this
 * machine itself (the loopback address, not relayed by a proxy), or a signed-in moderator. Never
 * anyone when NODE_ENV=production.
 */
import type { RequestEvent } from '@sveltejs/kit';
import { isProduction } from './config';
import { hasRole } from './guards';

// A reverse proxy on the same machine connects from loopback; its headers say the visitor is elsewhere.
const RELAY_HEADERS = ['forwarded', 'x-forwarded-for', 'x-real-ip', 'via'];

export function isLoopback(address: string): boolean {
	return /^(127\.\d{1,3}\.\d{1,3}\.\d{1,3}|::1|::ffff:127\.\d{1,3}\.\d{1,3}\.\d{1,3})$/.test(
		address
	);
}

export function isLocalRequest(event: Pick<RequestEvent, 'getClientAddress' | 'request'>): boolean {
	if (RELAY_HEADERS.some((h) => event.request.headers.has(h))) return false;
	try {
		return isLoopback(event.getClientAddress());
	} catch {
		return false;
	}
}

export function isOperator(
	event: Pick<RequestEvent, 'getClientAddress' | 'request' | 'locals'>
): boolean {
	if (isProduction()) return false;
	return isLocalRequest(event) || hasRole(event.locals.user, 'moderator');
}

import { getRequestEvent } from '$app/server';
import { error, redirect } from '@sveltejs/kit';
import type { Role } from '../db/schema';
import type { SessionUser } from '../accounts/auth';

const RANK: Record<Role, number> = { member: 1, reviewer: 2, moderator: 3 };

/** Signed in, or sent to sign-in (pages) / 401 (API). */
export function requireUser(): SessionUser {
	const event = getRequestEvent();
	const user = event.locals.user;
	if (!user) {
		if (event.url.pathname.startsWith('/api/')) error(401, 'Sign in first.');
		redirect(303, `/signin?next=${encodeURIComponent(event.url.pathname + event.url.search)}`);
	}
	return user;
}

/** A member may author only once the e-mail address is verified. */
export function requireVerifiedMember(): SessionUser {
	const user = requireUser();
	if (!user.emailVerified) error(403, 'Verify your e-mail address first (see your account page).');
	return user;
}

export function hasRole(user: SessionUser | null, role: Role): boolean {
	return !!user && user.emailVerified && RANK[user.role] >= RANK[role];
}

export function requireRole(role: Role): SessionUser {
	const user = requireUser();
	if (!hasRole(user, role)) error(403, `This page is for ${role}s.`);
	return user;
}

/**
 * Sessions as Lucia's current guide defines them (lucia-auth.com, "Basic session API"): the
 * token is `<id>.<secret>`, each part 120 random bits; the database keeps only SHA-256(secret),
 * compared in constant time. Sessions end after 10 days without use (refreshed at most hourly)
 * and in any case 30 days after sign-in.
 */
import { sha256 } from '@oslojs/crypto/sha2';
import { constantTimeEqual } from '@oslojs/crypto/subtle';
import { encodeBase32LowerCaseNoPadding } from '@oslojs/encoding';
import type { Cookies } from '@sveltejs/kit';
import { eq } from 'drizzle-orm';
import { db } from '../db';
import { sessions, users, type Role } from '../db/schema';

export const SESSION_COOKIE = 'bw_session';
export const INACTIVITY_MS = 10 * 24 * 60 * 60 * 1000;
export const ABSOLUTE_MS = 30 * 24 * 60 * 60 * 1000;
export const REFRESH_MS = 60 * 60 * 1000;

export interface SessionUser {
	id: string;
	email: string;
	displayName: string;
	role: Role;
	emailVerified: boolean;
}

export interface Session {
	id: string;
	userId: string;
	createdAt: Date;
	lastVerifiedAt: Date;
}

/** 120 bits from the platform CSPRNG, base32. */
export function randomSecret(): string {
	const bytes = new Uint8Array(15);
	crypto.getRandomValues(bytes);
	return encodeBase32LowerCaseNoPadding(bytes);
}

export function hashSecret(secret: string): Uint8Array {
	return sha256(new TextEncoder().encode(secret));
}

export function createSession(
	userId: string,
	now = Date.now()
): { token: string; session: Session } {
	const id = randomSecret();
	const secret = randomSecret();
	const row = {
		id,
		userId,
		secretHash: Buffer.from(hashSecret(secret)),
		createdAt: new Date(now),
		lastVerifiedAt: new Date(now)
	};
	db.insert(sessions).values(row).run();
	return {
		token: `${id}.${secret}`,
		session: { id, userId, createdAt: row.createdAt, lastVerifiedAt: row.lastVerifiedAt }
	};
}

export function validateSessionToken(
	token: string,
	now = Date.now()
): { session: Session; user: SessionUser; refreshed: boolean } | null {
	const parts = token.split('.');
	if (parts.length !== 2 || !/^[a-z2-7]{24}$/.test(parts[0]) || !/^[a-z2-7]{24}$/.test(parts[1])) {
		return null;
	}
	const [id, secret] = parts;
	const row = db
		.select({ session: sessions, user: users })
		.from(sessions)
		.innerJoin(users, eq(users.id, sessions.userId))
		.where(eq(sessions.id, id))
		.get();
	if (!row) return null;
	if (!constantTimeEqual(hashSecret(secret), new Uint8Array(row.session.secretHash))) return null;
	const s = row.session;
	if (
		row.user.disabledAt ||
		now - s.lastVerifiedAt.getTime() >= INACTIVITY_MS ||
		now - s.createdAt.getTime() >= ABSOLUTE_MS
	) {
		invalidateSession(id);
		return null;
	}
	let refreshed = false;
	if (now - s.lastVerifiedAt.getTime() >= REFRESH_MS) {
		s.lastVerifiedAt = new Date(now);
		db.update(sessions).set({ lastVerifiedAt: s.lastVerifiedAt }).where(eq(sessions.id, id)).run();
		refreshed = true;
	}
	return {
		session: {
			id: s.id,
			userId: s.userId,
			createdAt: s.createdAt,
			lastVerifiedAt: s.lastVerifiedAt
		},
		user: toSessionUser(row.user),
		refreshed
	};
}

export function toSessionUser(u: typeof users.$inferSelect): SessionUser {
	return {
		id: u.id,
		email: u.email,
		displayName: u.displayName,
		role: u.role,
		emailVerified: u.emailVerifiedAt !== null
	};
}

export function invalidateSession(sessionId: string): void {
	db.delete(sessions).where(eq(sessions.id, sessionId)).run();
}

export function invalidateUserSessions(userId: string): void {
	db.delete(sessions).where(eq(sessions.userId, userId)).run();
}

export function setSessionCookie(
	cookies: Cookies,
	token: string,
	session: Session,
	secure: boolean
) {
	const expires = new Date(
		Math.min(
			session.lastVerifiedAt.getTime() + INACTIVITY_MS,
			session.createdAt.getTime() + ABSOLUTE_MS
		)
	);
	cookies.set(SESSION_COOKIE, token, {
		path: '/',
		httpOnly: true,
		sameSite: 'lax',
		secure,
		expires
	});
}

export function clearSessionCookie(cookies: Cookies) {
	cookies.delete(SESSION_COOKIE, { path: '/' });
}

import { and, eq, isNull } from 'drizzle-orm';
import { db } from '../db';
import { emailTokens, users, type TokenPurpose } from '../db/schema';
import { hashSecret, invalidateUserSessions, randomSecret } from './auth';
import { burnPasswordCheck, hashPassword, verifyPassword } from './password';
import { constantTimeEqual } from '@oslojs/crypto/subtle';

const TOKEN_LIFETIME_MS: Record<TokenPurpose, number> = {
	verify_email: 48 * 60 * 60 * 1000,
	reset_password: 60 * 60 * 1000
};

const normalizeEmail = (email: string) => email.trim().toLowerCase();

export function newId(): string {
	return randomSecret();
}

export function findUserByEmail(email: string) {
	return (
		db
			.select()
			.from(users)
			.where(eq(users.email, normalizeEmail(email)))
			.get() ?? null
	);
}

export async function createAccount(input: {
	email: string;
	displayName: string;
	password: string;
}) {
	const email = normalizeEmail(input.email);
	const passwordHash = await hashPassword(input.password);
	const id = newId();
	const inserted = db
		.insert(users)
		.values({ id, email, displayName: input.displayName.trim(), passwordHash })
		.onConflictDoNothing({ target: users.email })
		.returning({ id: users.id })
		.get();
	return inserted ? { id, email } : null;
}

/** Same work and the same answer for "no such account" and "wrong password". */
export async function checkCredentials(email: string, password: string) {
	const user = findUserByEmail(email);
	if (!user || user.disabledAt) {
		await burnPasswordCheck(password);
		return null;
	}
	return (await verifyPassword(user.passwordHash, password)) ? user : null;
}

/** A single-use token `<id>.<secret>`; the stored row keeps SHA-256(secret) only. */
export function issueEmailToken(userId: string, purpose: TokenPurpose, now = Date.now()): string {
	const id = randomSecret();
	const secret = randomSecret();
	db.transaction((tx) => {
		tx.delete(emailTokens)
			.where(
				and(
					eq(emailTokens.userId, userId),
					eq(emailTokens.purpose, purpose),
					isNull(emailTokens.usedAt)
				)
			)
			.run();
		tx.insert(emailTokens)
			.values({
				id,
				userId,
				purpose,
				secretHash: Buffer.from(hashSecret(secret)),
				expiresAt: new Date(now + TOKEN_LIFETIME_MS[purpose])
			})
			.run();
	});
	return `${id}.${secret}`;
}

export type TokenCheck =
	{ ok: true; userId: string } | { ok: false; reason: 'invalid' | 'expired' | 'used' };

export function peekEmailToken(token: string, purpose: TokenPurpose, now = Date.now()): TokenCheck {
	const [id, secret, extra] = token.split('.');
	if (!id || !secret || extra !== undefined || id.length > 40 || secret.length > 40) {
		return { ok: false, reason: 'invalid' };
	}
	const row = db.select().from(emailTokens).where(eq(emailTokens.id, id)).get();
	if (!row || row.purpose !== purpose) return { ok: false, reason: 'invalid' };
	if (!constantTimeEqual(hashSecret(secret), new Uint8Array(row.secretHash))) {
		return { ok: false, reason: 'invalid' };
	}
	if (row.usedAt) return { ok: false, reason: 'used' };
	if (row.expiresAt.getTime() <= now) return { ok: false, reason: 'expired' };
	return { ok: true, userId: row.userId };
}

function markUsed(token: string, now: number) {
	const id = token.split('.')[0];
	return db
		.update(emailTokens)
		.set({ usedAt: new Date(now) })
		.where(and(eq(emailTokens.id, id), isNull(emailTokens.usedAt)))
		.run().changes;
}

export function verifyEmail(token: string, now = Date.now()): TokenCheck {
	const check = peekEmailToken(token, 'verify_email', now);
	if (!check.ok) return check;
	return db.transaction((tx) => {
		if (markUsed(token, now) !== 1) return { ok: false as const, reason: 'used' as const };
		tx.update(users)
			.set({ emailVerifiedAt: new Date(now) })
			.where(eq(users.id, check.userId))
			.run();
		return check;
	});
}

/** Sets the new password, uses up the token and ends every session of the account. */
export async function resetPassword(
	token: string,
	password: string,
	now = Date.now()
): Promise<TokenCheck> {
	const check = peekEmailToken(token, 'reset_password', now);
	if (!check.ok) return check;
	const passwordHash = await hashPassword(password);
	return db.transaction(() => {
		if (markUsed(token, now) !== 1) return { ok: false as const, reason: 'used' as const };
		db.update(users).set({ passwordHash }).where(eq(users.id, check.userId)).run();
		invalidateUserSessions(check.userId);
		return check;
	});
}

export const TOKEN_MESSAGES: Record<'invalid' | 'expired' | 'used', string> = {
	invalid: 'This link is not valid. Check that you copied the whole link.',
	expired: 'This link has expired. Ask for a new one.',
	used: 'This link has already been used. Ask for a new one if you still need it.'
};

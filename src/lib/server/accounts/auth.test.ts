import { describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '../db';
import { sessions, users } from '../db/schema';
import {
	ABSOLUTE_MS,
	INACTIVITY_MS,
	REFRESH_MS,
	createSession,
	invalidateUserSessions,
	validateSessionToken
} from './auth';
import {
	createAccount,
	issueEmailToken,
	peekEmailToken,
	resetPassword,
	verifyEmail,
	checkCredentials
} from './accounts';

async function newUser(email: string) {
	const created = await createAccount({
		email,
		displayName: 'Tester',
		password: 'a long test passphrase'
	});
	return created!.id;
}

describe('sessions (Lucia current scheme)', () => {
	it('issues <id>.<secret> tokens of 2 × 120 bits and stores only a hash of the secret', async () => {
		const userId = await newUser('s1@example.org');
		const { token } = createSession(userId);
		const [id, secret] = token.split('.');
		// 24 base32 characters × 5 bits = 120 bits each (ASVS 5.0 7.2.3 asks ≥ 128 bits of entropy for the whole token).
		expect(id).toMatch(/^[a-z2-7]{24}$/);
		expect(secret).toMatch(/^[a-z2-7]{24}$/);
		const row = db.select().from(sessions).where(eq(sessions.id, id)).get()!;
		expect(row.secretHash.length).toBe(32);
		expect(row.secretHash.toString('utf8')).not.toContain(secret);
		expect(validateSessionToken(token)?.user.email).toBe('s1@example.org');
	});

	it('rejects a tampered secret, a malformed token and an unknown id', async () => {
		const userId = await newUser('s2@example.org');
		const { token } = createSession(userId);
		const [id, secret] = token.split('.');
		const flipped = secret[0] === 'a' ? 'b' + secret.slice(1) : 'a' + secret.slice(1);
		expect(validateSessionToken(`${id}.${flipped}`)).toBeNull();
		expect(validateSessionToken(`${id}`)).toBeNull();
		expect(validateSessionToken(`${id}.${secret}.x`)).toBeNull();
		expect(validateSessionToken(`${'a'.repeat(24)}.${secret}`)).toBeNull();
		expect(validateSessionToken('')).toBeNull();
	});

	it('refreshes at most hourly, expires after inactivity and after the absolute lifetime', async () => {
		const userId = await newUser('s3@example.org');
		const t0 = Date.now();
		const a = createSession(userId, t0);
		expect(validateSessionToken(a.token, t0 + REFRESH_MS - 1)?.refreshed).toBe(false);
		expect(validateSessionToken(a.token, t0 + REFRESH_MS)?.refreshed).toBe(true);
		// Sliding: still valid 9 days after the refresh, gone 10 days after it.
		expect(validateSessionToken(a.token, t0 + REFRESH_MS + INACTIVITY_MS - 1000)).not.toBeNull();
		const b = createSession(userId, t0);
		expect(validateSessionToken(b.token, t0 + INACTIVITY_MS)).toBeNull();
		expect(db.select().from(sessions).where(eq(sessions.id, b.session.id)).get()).toBeUndefined();
		// Absolute: even a session used every few hours ends 30 days after sign-in.
		const c = createSession(userId, t0);
		for (let t = t0; t < t0 + ABSOLUTE_MS; t += 5 * 24 * 3600 * 1000) {
			expect(validateSessionToken(c.token, t)).not.toBeNull();
		}
		expect(validateSessionToken(c.token, t0 + ABSOLUTE_MS)).toBeNull();
	});

	it('ends every session of a user at once, and a disabled account has none', async () => {
		const userId = await newUser('s4@example.org');
		const a = createSession(userId);
		const b = createSession(userId);
		invalidateUserSessions(userId);
		expect(validateSessionToken(a.token)).toBeNull();
		expect(validateSessionToken(b.token)).toBeNull();
		const c = createSession(userId);
		db.update(users).set({ disabledAt: new Date() }).where(eq(users.id, userId)).run();
		expect(validateSessionToken(c.token)).toBeNull();
	});
});

describe('e-mail tokens', () => {
	it('verification is single-use and expires after 48 hours', async () => {
		const userId = await newUser('t1@example.org');
		const t0 = Date.now();
		const token = issueEmailToken(userId, 'verify_email', t0);
		expect(peekEmailToken(token, 'reset_password', t0)).toEqual({ ok: false, reason: 'invalid' });
		expect(verifyEmail(token, t0 + 1000)).toEqual({ ok: true, userId });
		expect(verifyEmail(token, t0 + 2000)).toEqual({ ok: false, reason: 'used' });
		const late = issueEmailToken(userId, 'verify_email', t0);
		expect(verifyEmail(late, t0 + 48 * 3600 * 1000)).toEqual({ ok: false, reason: 'expired' });
	});

	it('a new token replaces the unused one; reset ends sessions and changes the password', async () => {
		const userId = await newUser('t2@example.org');
		const first = issueEmailToken(userId, 'reset_password');
		const second = issueEmailToken(userId, 'reset_password');
		expect(peekEmailToken(first, 'reset_password').ok).toBe(false);
		const s = createSession(userId);
		expect(await resetPassword(second, 'the new long passphrase')).toEqual({ ok: true, userId });
		expect(validateSessionToken(s.token)).toBeNull();
		expect(await checkCredentials('t2@example.org', 'a long test passphrase')).toBeNull();
		expect((await checkCredentials('T2@example.org', 'the new long passphrase'))?.id).toBe(userId);
		expect((await resetPassword(second, 'yet another passphrase')).ok).toBe(false);
	});

	it('a duplicate e-mail (any case) makes no second account', async () => {
		await newUser('dup@example.org');
		expect(
			await createAccount({
				email: 'DUP@example.org',
				displayName: 'x',
				password: 'another long one'
			})
		).toBeNull();
	});
});

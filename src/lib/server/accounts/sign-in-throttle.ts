/**
 * Sign-in slow-down per account, against guessing spread over many addresses (the per-address and
 * per-browser limits in http/rate-limit.ts do not see it). After FREE_FAILURES failed sign-ins on one
 * e-mail address, attempts on that address take turns, spaced 1 s apart, doubling with each further
 * failure up to 16 s. It is not a lockout an attacker can use against the owner: the right password
 * still signs in once its turn comes, and success clears the count. A turn more than a minute away
 * (a crowd guessing at once) is refused at once, so no connection is held that long. Failures are
 * forgotten 15 minutes after the last one. Addresses are kept hashed, unknown ones like known ones.
 * (OWASP Authentication Cheat Sheet, "Account lockout": throttle rather than lock; ASVS 5.0 6.3.1.)
 */
import { LRUCache } from 'lru-cache';
import { hashKey } from '../http/hash';

export const FREE_FAILURES = 5;
const FIRST_DELAY_MS = 1000;
const MAX_DELAY_MS = 16_000;
const MAX_WAIT_MS = 60_000;
const FORGET_AFTER_MS = 15 * 60_000;

interface Account {
	failures: number;
	lastFailureAt: number;
	/** The earliest time the next attempt may be checked. */
	nextAt: number;
}

export type Turn = { ok: true } | { ok: false; retryAfterSeconds: number };

const delayAfter = (failures: number) =>
	failures < FREE_FAILURES
		? 0
		: Math.min(FIRST_DELAY_MS * 2 ** (failures - FREE_FAILURES), MAX_DELAY_MS);

export function createSignInThrottle({
	now = Date.now,
	sleep = (ms: number) => new Promise<void>((resolve) => setTimeout(resolve, ms)),
	capacity = 10_000
}: { now?: () => number; sleep?: (ms: number) => Promise<void>; capacity?: number } = {}) {
	const accounts = new LRUCache<string, Account>({ max: capacity });
	const keyOf = (email: string) => hashKey(email.trim().toLowerCase());

	function current(key: string, t: number): Account | undefined {
		const a = accounts.get(key);
		if (a && t - a.lastFailureAt > FORGET_AFTER_MS) {
			accounts.delete(key);
			return undefined;
		}
		return a;
	}

	return {
		/** Waits until this address may be checked again; refuses when that is over a minute away. */
		async turn(email: string): Promise<Turn> {
			const t = now();
			const a = current(keyOf(email), t);
			const delay = a ? delayAfter(a.failures) : 0;
			if (!a || delay === 0) return { ok: true };
			const slot = Math.max(t, a.nextAt);
			if (slot - t > MAX_WAIT_MS)
				return { ok: false, retryAfterSeconds: Math.ceil((slot - t) / 1000) };
			a.nextAt = slot + delay;
			if (slot > t) await sleep(slot - t);
			return { ok: true };
		},
		failed(email: string): void {
			const key = keyOf(email);
			const t = now();
			const a = current(key, t) ?? { failures: 0, lastFailureAt: t, nextAt: t };
			a.failures++;
			a.lastFailureAt = t;
			a.nextAt = Math.max(a.nextAt, t + delayAfter(a.failures));
			accounts.set(key, a);
		},
		succeeded(email: string): void {
			accounts.delete(keyOf(email));
		}
	};
}

/** The server's one throttle. */
export const signInThrottle = createSignInThrottle();

import { describe, expect, it } from 'vitest';
import { createSignInThrottle, FREE_FAILURES } from './sign-in-throttle';

/** A clock that moves only when a sleep ends (after every call started so far) or the test says so. */
function fakeTime() {
	let t = 1_000_000;
	const slept: number[] = [];
	return {
		now: () => t,
		sleep: async (ms: number) => {
			slept.push(ms);
			const until = t + ms;
			await null;
			t = Math.max(t, until);
		},
		advance: (ms: number) => (t += ms),
		slept
	};
}

describe('per-account sign-in slow-down', () => {
	it('lets the first failures through at once, then spaces attempts 1 s, 2 s, 4 s … apart, up to 16 s', async () => {
		const time = fakeTime();
		const throttle = createSignInThrottle(time);
		for (let i = 0; i < FREE_FAILURES; i++) {
			expect(await throttle.turn('Victim@Example.org')).toEqual({ ok: true });
			throttle.failed('victim@example.org');
		}
		expect(time.slept).toEqual([]);
		for (let i = 0; i < 6; i++) {
			expect((await throttle.turn(' victim@example.org ')).ok).toBe(true);
			throttle.failed('victim@example.org');
		}
		// [calc] 1 s × 2^(n − 5) for the n-th failure so far, capped at 16 s
		expect(time.slept).toEqual([1000, 2000, 4000, 8000, 16000, 16000]);
	});

	it('is not a lockout: the owner gets in after the wait, and success clears the count', async () => {
		const time = fakeTime();
		const throttle = createSignInThrottle(time);
		for (let i = 0; i < FREE_FAILURES + 2; i++) {
			await throttle.turn('owner@example.org');
			throttle.failed('owner@example.org');
		}
		const before = time.slept.length;
		expect(await throttle.turn('owner@example.org')).toEqual({ ok: true });
		expect(time.slept.length).toBe(before + 1);
		throttle.succeeded('owner@example.org');
		expect(await throttle.turn('owner@example.org')).toEqual({ ok: true });
		expect(time.slept.length).toBe(before + 1);
	});

	it('makes attempts that arrive together wait in line, and refuses at once a wait over a minute', async () => {
		const time = fakeTime();
		const throttle = createSignInThrottle(time);
		for (let i = 0; i < FREE_FAILURES + 4; i++) throttle.failed('crowded@example.org');
		// Nine failures: 16 s apart. Four at once are given 16, 32, 48 and 64 s: the last is refused.
		const crowd = await Promise.all(
			Array.from({ length: 4 }, () => throttle.turn('crowded@example.org'))
		);
		expect(time.slept).toEqual([16000, 32000, 48000]);
		expect(crowd.slice(0, 3).every((r) => r.ok)).toBe(true);
		expect(crowd[3]).toEqual({ ok: false, retryAfterSeconds: 64 });
	});

	it('forgets failures 15 minutes after the last one, and keeps accounts apart', async () => {
		const time = fakeTime();
		const throttle = createSignInThrottle(time);
		for (let i = 0; i < FREE_FAILURES; i++) throttle.failed('a@example.org');
		await throttle.turn('b@example.org');
		expect(time.slept).toEqual([]);
		time.advance(15 * 60_000 + 1);
		await throttle.turn('a@example.org');
		expect(time.slept).toEqual([]);
	});
});

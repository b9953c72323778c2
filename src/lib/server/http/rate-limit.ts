import { env } from '$env/dynamic/private';
import { error, type RequestEvent } from '@sveltejs/kit';
import { RateLimiter } from 'sveltekit-rate-limiter/server';
import { hashKey } from './hash';
import type { Rate } from 'sveltekit-rate-limiter/server';

// RATE_LIMIT_FACTOR multiplies every limit (tests and benchmarks raise it; 1 in production).
const factor = () => Math.max(1, Number(env.RATE_LIMIT_FACTOR) || 1);

function limiter(perMinute: number, perHour: number) {
	let built: RateLimiter | null = null;
	let builtFactor = 0;
	return () => {
		if (!built || builtFactor !== factor()) {
			builtFactor = factor();
			// Per address and browser, plus a looser cap per address (shared networks, rotating agents).
			const ipua: Rate[] = [
				[perMinute * builtFactor, 'm'],
				[perHour * builtFactor, 'h']
			];
			const ip: Rate[] = [
				[perMinute * 3 * builtFactor, 'm'],
				[perHour * 3 * builtFactor, 'h']
			];
			// Keys are stored hashed (no raw addresses in memory). The package's default hashes with
			// crypto.subtle, asynchronously, four times a request (about 57 µs each here); node's
			// synchronous hash takes about 1.2 µs.
			built = new RateLimiter({ IP: ip, IPUA: ipua, hashFunction: hashKey });
		}
		return built;
	};
}

const limiters = {
	signIn: limiter(10, 60),
	signUp: limiter(5, 30),
	reset: limiter(5, 20),
	verify: limiter(10, 60),
	compute: limiter(240, 6000),
	upload: limiter(20, 200),
	write: limiter(60, 1200)
};

export type LimitName = keyof typeof limiters;

export async function isLimited(name: LimitName, event: RequestEvent): Promise<boolean> {
	return limiters[name]().isLimited(event);
}

/** For JSON endpoints and uploads: a 429 page/response. */
export async function enforceLimit(name: LimitName, event: RequestEvent): Promise<void> {
	if (await isLimited(name, event)) error(429, 'Too many requests. Wait a minute and try again.');
}

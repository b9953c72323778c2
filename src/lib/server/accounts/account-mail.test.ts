import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SMTPServer } from 'smtp-server';
import type { AddressInfo } from 'node:net';
import { env } from '$env/dynamic/private';
import { createAccount } from './accounts';
import { requestPasswordReset } from './account-mail';

// A mail server that takes 300 ms to accept each message, as a distant one may.
let smtpDelayMs = 300;
const received: string[] = [];
const smtp = new SMTPServer({
	authOptional: true,
	disabledCommands: ['STARTTLS'],
	logger: false,
	onData(stream, session, callback) {
		received.push(session.envelope.rcptTo.map((r) => r.address).join(','));
		stream.resume();
		stream.on('end', () => setTimeout(callback, smtpDelayMs));
	}
});

beforeAll(async () => {
	await new Promise<void>((resolve) => smtp.listen(0, '127.0.0.1', resolve));
	env.SMTP_URL = `smtp://127.0.0.1:${(smtp.server.address() as AddressInfo).port}`;
	await createAccount({
		email: 'known@example.org',
		displayName: 'Known',
		password: 'long enough pass'
	});
});
afterAll(() => new Promise<void>((resolve) => smtp.close(resolve)));

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

describe('password reset requests', () => {
	it('take the same time for an address with an account and one without, however slow the mail server', async () => {
		const known: number[] = [];
		const unknown: number[] = [];
		for (let i = 0; i < 15; i++) {
			for (const [email, times] of [
				['known@example.org', known],
				[`nobody-${i}@example.org`, unknown]
			] as const) {
				const t = performance.now();
				await requestPasswordReset(email);
				times.push(performance.now() - t);
			}
		}
		// Neither the mail server's 300 ms nor the token and queue rows (about 1 ms) may show.
		expect(Math.abs(median(known) - median(unknown))).toBeLessThan(0.5);
		// … and every mail still goes out, from the queue.
		smtpDelayMs = 0;
		await expect.poll(() => received.length, { timeout: 10_000 }).toBe(15);
		expect(new Set(received)).toEqual(new Set(['known@example.org']));
	});
});

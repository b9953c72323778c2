import { afterAll, describe, expect, it } from 'vitest';
import Database from 'better-sqlite3';
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { mailQueue } from './schema';
import { openDatabase } from './client';
import { BUSY_TIMEOUT_MS, isBusy, retryBusy } from './busy';

const dir = mkdtempSync(join(tmpdir(), 'bandwright-busy-'));
const file = join(dir, 'busy.db');
const { db, sqlite } = openDatabase(file);
sqlite.pragma(`busy_timeout = ${BUSY_TIMEOUT_MS}`);
afterAll(() => {
	sqlite.close();
	rmSync(dir, { recursive: true, force: true });
});

const queueOne = () =>
	db.transaction((tx) => {
		const before = tx.select().from(mailQueue).all().length;
		tx.insert(mailQueue)
			.values({
				toAddress: 'a@example.org',
				subject: `n${before}`,
				body: '',
				nextAttemptAt: new Date()
			})
			.run();
		return before + 1;
	});

/** Another process that takes the write lock, says "locked", and holds it for holdMs. */
async function lockFromAnotherProcess(holdMs: number): Promise<ChildProcess> {
	const child = spawn(
		process.execPath,
		[
			'-e',
			`const db = new (require('better-sqlite3'))(${JSON.stringify(file)});
			 db.exec('BEGIN IMMEDIATE'); console.log('locked');
			 setTimeout(() => { db.exec('COMMIT'); db.close(); }, ${holdMs});`
		],
		{ stdio: ['ignore', 'pipe', 'inherit'] }
	);
	await new Promise<void>((resolve, reject) => {
		child.stdout!.on('data', (d) => String(d).includes('locked') && resolve());
		child.once('exit', () => reject(new Error('the locking process ended early')));
	});
	return child;
}

/** The longest stretch the event loop could not run a timer, while `work` runs. */
async function longestStall<T>(
	work: () => Promise<T>
): Promise<{ result: PromiseSettledResult<T>; stallMs: number }> {
	let last = performance.now();
	let stallMs = 0;
	const timer = setInterval(() => {
		const now = performance.now();
		stallMs = Math.max(stallMs, now - last);
		last = now;
	}, 5);
	const [result] = await Promise.allSettled([work()]);
	clearInterval(timer);
	return { result, stallMs: Math.max(stallMs, performance.now() - last) };
}

describe('writers and the lock', () => {
	it('a transaction holds the write lock from BEGIN, so its read-then-write cannot be overtaken', () => {
		const other = new Database(file, { timeout: 0 });
		db.transaction((tx) => {
			tx.select().from(mailQueue).all();
			// A deferred transaction would hold no lock yet, and this write would get in first.
			expect(() =>
				other
					.prepare(
						"INSERT INTO mail_queue (to_address, subject, body, next_attempt_at) VALUES ('b@example.org', 's', '', 0)"
					)
					.run()
			).toThrow(/locked|busy/i);
		});
		other.close();
	});

	it('waits for another process without blocking the event loop, then writes', async () => {
		const child = await lockFromAnotherProcess(1500);
		const { result, stallMs } = await longestStall(() => retryBusy(queueOne));
		expect(result.status).toBe('fulfilled');
		// A 5 s busy_timeout would stall the loop for the whole 1.5 s; here each wait is 20 ms.
		expect(stallMs).toBeLessThan(500);
		child.kill();
	});

	it('answers 503 when the lock outlasts every try, still without blocking', async () => {
		const child = await lockFromAnotherProcess(20_000);
		try {
			const { result, stallMs } = await longestStall(() => retryBusy(queueOne));
			expect(result.status).toBe('rejected');
			expect((result as PromiseRejectedResult).reason).toMatchObject({ status: 503 });
			expect(stallMs).toBeLessThan(500);
		} finally {
			child.kill();
		}
	});

	it('knows busy errors also when drizzle wraps them, and passes others through untouched', async () => {
		expect(isBusy(Object.assign(new Error('database is locked'), { code: 'SQLITE_BUSY' }))).toBe(
			true
		);
		expect(
			isBusy(
				new Error('Failed query', {
					cause: Object.assign(new Error('x'), { code: 'SQLITE_BUSY_SNAPSHOT' })
				})
			)
		).toBe(true);
		expect(
			isBusy(Object.assign(new Error('constraint'), { code: 'SQLITE_CONSTRAINT_UNIQUE' }))
		).toBe(false);
		let calls = 0;
		await expect(
			retryBusy(() => {
				calls++;
				throw new Error('not a lock');
			})
		).rejects.toThrow('not a lock');
		expect(calls).toBe(1);
	});
});

/**
 * Another writer holds SQLite's lock (a script, a backup, a second server). The connection waits
 * only BUSY_TIMEOUT_MS in SQLite's own busy handler, which blocks the event loop; longer waits
 * happen here, between tries, with the event loop free. When the lock outlasts every try, the
 * request ends in a 503 that says when to come back (hooks.server.ts adds Retry-After): a form
 * failure where the route maps DomainErrors (the form keeps what was typed), an error page elsewhere.
 */
import { DomainError } from '../http/errors';

export const BUSY_TIMEOUT_MS = 20;
/** Pauses between tries: about 2.5 s in all, then the request gives up. */
const RETRY_DELAYS_MS = [10, 20, 40, 80, 160, 320, 500, 500, 500, 500];
export const RETRY_AFTER_SECONDS = 3;
export const BUSY_MESSAGE = 'The database is busy with another task; try again in a few seconds.';

/** SQLITE_BUSY (and its extended codes) or SQLITE_LOCKED, also when wrapped by drizzle as a cause. */
export function isBusy(e: unknown): boolean {
	for (let c = e, depth = 0; c && depth < 5; c = (c as { cause?: unknown }).cause, depth++) {
		const code = (c as { code?: unknown }).code;
		if (typeof code === 'string' && /^SQLITE_(BUSY|LOCKED)/.test(code)) return true;
	}
	return false;
}

export class DatabaseBusyError extends DomainError {
	constructor() {
		super(503, BUSY_MESSAGE);
		this.name = 'DatabaseBusyError';
	}
}

/** The answer when even reading the session met the lock. */
export const busyResponse = () =>
	new Response(BUSY_MESSAGE, {
		status: 503,
		headers: {
			'content-type': 'text/plain; charset=utf-8',
			'retry-after': String(RETRY_AFTER_SECONDS)
		}
	});

const pause = (ms: number) => new Promise<void>((resolve) => setTimeout(resolve, ms));

/**
 * Runs a write, trying again while the database is busy. The write must be safe to repeat after a
 * busy failure: a transaction (immediate, see client.ts) fails at BEGIN, before it changes anything.
 * @throws DatabaseBusyError (a 503) when the lock outlasts every try
 */
export async function retryBusy<T>(
	write: () => T | Promise<T>,
	delays: readonly number[] = RETRY_DELAYS_MS
): Promise<T> {
	for (let attempt = 0; ; attempt++) {
		try {
			return await write();
		} catch (e) {
			if (!isBusy(e)) throw e;
			if (attempt >= delays.length) throw new DatabaseBusyError();
			await pause(delays[attempt]);
		}
	}
}

import Database from 'better-sqlite3';
import { drizzle } from 'drizzle-orm/better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import { mkdirSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import * as schema from './schema';

/**
 * Opens the SQLite file with our pragmas. WAL with synchronous=NORMAL: every commit is
 * consistent, and a power loss may lose only the last commits (never corrupts).
 *
 * Every transaction is IMMEDIATE unless it asks otherwise: it takes the write lock at BEGIN, so a
 * transaction that reads and then writes never fails halfway (a DEFERRED one that finds another
 * writer when it tries to write gets SQLITE_BUSY at once, without waiting). SQLite waits for a
 * lock up to 5 s here, blocking the thread: right for scripts and migrations; the server shortens
 * it at start and retries without blocking (db/busy.ts, hooks.server.ts).
 */
export function openDatabase(path: string, options: { migrationsFolder?: string } = {}) {
	if (path !== ':memory:') mkdirSync(dirname(resolve(path)), { recursive: true });
	const sqlite = new Database(path, { timeout: 5000 });
	sqlite.pragma('journal_mode = WAL');
	sqlite.pragma('synchronous = NORMAL');
	sqlite.pragma('foreign_keys = ON');
	sqlite.pragma('busy_timeout = 5000');
	const db = drizzle(sqlite, { schema });
	const transaction = db.transaction.bind(db);
	db.transaction = ((fn, config) =>
		transaction(fn, { behavior: 'immediate', ...config })) as typeof db.transaction;
	migrate(db, { migrationsFolder: options.migrationsFolder ?? resolve('drizzle') });
	return { sqlite, db };
}

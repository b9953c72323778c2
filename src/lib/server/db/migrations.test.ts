import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { openDatabase } from './client';

const temp = mkdtempSync(join(tmpdir(), 'bw-migrate-'));
afterAll(() => rmSync(temp, { recursive: true, force: true }));

/** A migrations folder holding only the first `count` migrations, as an older release shipped. */
function olderMigrations(count: number): string {
	const dir = join(temp, `migrations-${count}`);
	cpSync(resolve('drizzle'), dir, { recursive: true });
	const journalPath = join(dir, 'meta', '_journal.json');
	const journal = JSON.parse(readFileSync(journalPath, 'utf8'));
	journal.entries = journal.entries.slice(0, count);
	writeFileSync(journalPath, JSON.stringify(journal));
	return dir;
}

describe('migrations 0002 (listing columns), 0003 (sweep metrics) and 0004 (page stamp) on a database with data', () => {
	it('fills the listing columns and moves the search index to integer row ids', () => {
		const file = join(temp, 'upgrade.db');
		const old = openDatabase(file, { migrationsFolder: olderMigrations(2) }).sqlite;
		const now = Date.now();
		old.exec(`
			INSERT INTO users (id, email, display_name, password_hash) VALUES ('u1', 'a@example.org', 'A', 'x');
			INSERT INTO designs (id, slug, title, family, polarization, owner_id, created_at, updated_at)
				VALUES ('d1', 'old-helix', 'Old helix', 'helical', 'rhcp', 'u1', ${now}, ${now}),
				       ('d2', 'old-draft', 'Old draft', 'dipole', 'linear', 'u1', ${now}, ${now});
			INSERT INTO revisions (id, design_id, number, state, author_id, content, design_hz, claim_lo_hz, claim_hi_hz, created_at, updated_at)
				VALUES ('r1', 'd1', 1, 'approved', 'u1', '{}', 435e6, 430e6, 440e6, ${now}, ${now}),
				       ('r2', 'd1', 2, 'submitted', 'u1', '{}', 436e6, 431e6, 441e6, ${now}, ${now}),
				       ('r3', 'd2', 1, 'draft', 'u1', '{}', 868e6, 863e6, 873e6, ${now}, ${now});
			UPDATE designs SET shown_revision_id = 'r1' WHERE id = 'd1';
			INSERT INTO measurements (id, revision_id, uploader_id, kind, instrument, file_key, file_name, file_type, file_size, analysis)
				VALUES ('m1', 'r1', 'u1', 'build_report', 'vna', 'k', 'f.s1p', 't', 1, '{}'),
				       ('m2', 'r2', 'u1', 'build_report', 'vna', 'k', 'f.s1p', 't', 1, '{}'),
				       ('m3', 'r1', 'u1', 'measurement', 'vna', 'k', 'f.s1p', 't', 1, '{"min_vswr":1.2,"series":[[1,2]]}');
			INSERT INTO design_search (design_id, title, summary, notes) VALUES ('d1', 'Old helix', '', 'wind the tinplate helix');
		`);
		old.close();

		const { sqlite } = openDatabase(file);
		const rows = sqlite
			.prepare(
				'SELECT id, listed_revision_id, listed_lo_hz, listed_hi_hz, build_reports, search_rowid FROM designs ORDER BY id'
			)
			.all() as Record<string, unknown>[];
		expect(rows[0]).toMatchObject({
			id: 'd1',
			listed_revision_id: 'r1',
			listed_lo_hz: 430e6,
			listed_hi_hz: 440e6,
			build_reports: 2
		});
		expect(rows[1]).toMatchObject({ id: 'd2', listed_revision_id: null, build_reports: 0 });
		expect(new Set(rows.map((r) => r.search_rowid)).size).toBe(2);
		// The page stamp: one row, moved on by writes to what pages show.
		const stamp = () =>
			(sqlite.prepare('SELECT stamp FROM page_stamp').all() as { stamp: number }[]).map(
				(s) => s.stamp
			);
		const [before] = stamp();
		expect(stamp()).toHaveLength(1);
		sqlite.exec(`UPDATE designs SET title = 'Old helix, rewound' WHERE id = 'd1'`);
		expect(stamp()).toEqual([before + 1]);
		const hit = sqlite
			.prepare(
				'SELECT d.slug FROM design_search h JOIN designs d ON d.search_rowid = h.rowid WHERE design_search MATCH ?'
			)
			.all('"tinplate"*');
		expect(hit).toEqual([{ slug: 'old-helix' }]);

		// Sweep metrics: the analysis without its series, for old rows and new ones.
		const metricsOf = (id: string) =>
			JSON.parse(
				(
					sqlite.prepare('SELECT metrics FROM measurements WHERE id = ?').get(id) as {
						metrics: string;
					}
				).metrics
			);
		expect(metricsOf('m3')).toEqual({ min_vswr: 1.2 });
		sqlite.exec(`INSERT INTO measurements (id, revision_id, uploader_id, kind, instrument, file_key, file_name, file_type, file_size, analysis)
			VALUES ('m4', 'r2', 'u1', 'measurement', 'vna', 'k', 'f.s1p', 't', 1, '{"points":3,"series":[[1,2]]}')`);
		expect(metricsOf('m4')).toEqual({ points: 3 });

		// A deleted design leaves no index row behind for a later design to inherit.
		sqlite.exec(
			`DELETE FROM measurements; DELETE FROM revisions; DELETE FROM designs WHERE id = 'd1'`
		);
		expect(sqlite.prepare('SELECT count(*) AS n FROM design_search').get()).toEqual({ n: 0 });
		sqlite.exec(`INSERT INTO designs (id, slug, title, family, polarization, owner_id, created_at, updated_at)
			VALUES ('d3', 'new-one', 'New', 'patch', 'linear', 'u1', ${now}, ${now})`);
		const d3 = sqlite.prepare(`SELECT search_rowid AS n FROM designs WHERE id = 'd3'`).get() as {
			n: number;
		};
		expect(d3.n).toBeGreaterThan(0);
		expect(
			sqlite.prepare('SELECT count(*) AS n FROM designs WHERE search_rowid = ?').get(d3.n)
		).toEqual({ n: 1 });
		expect(sqlite.pragma('integrity_check', { simple: true })).toBe('ok');
		sqlite.close();
	});
});

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '../db';
import { designs, users } from '../db/schema';
import type { SessionUser } from '../accounts/auth';
import { toSessionUser } from '../accounts/auth';
import { getDesignBySlug } from './lookups';
import { startRevision, submitRevision } from './revisions';
import { submitReview } from '../reviews/reviews';
import { addMeasurement } from '../measurements/measurements';
import { setRole } from '../accounts/users';
import { searchDesigns } from './search';
import { resonanceRows, touchstone } from '../../testing/upload-fixtures';
import { designAt, member, tempStore, type TempStore } from '../../testing/server-setup';

let author: SessionUser;
let builder: SessionUser;
let reviewer: SessionUser;
let temp: TempStore;

const sweep = (f0MHz: number) => ({
	fields: {
		instrument: 'vna',
		reference_plane: 'feed connector',
		measured_on: '2026-01-01',
		notes: 'n',
		target_frequency: String(f0MHz * 1e6)
	},
	file: {
		bytes: new TextEncoder().encode(
			touchstone(resonanceRows(f0MHz, 8, 50, f0MHz - 200, f0MHz + 200, 201))
		),
		name: 'b.s1p'
	}
});

beforeAll(async () => {
	author = await member('listing-author@example.org');
	builder = await member('listing-builder@example.org');
	const r = await member('listing-reviewer@example.org');
	setRole(null, r.id, 'reviewer');
	reviewer = toSessionUser(db.select().from(users).where(eq(users.id, r.id)).get()!);
	temp = await tempStore();
});
afterAll(() => temp.cleanup());

const listed = (slug: string) => db.select().from(designs).where(eq(designs.slug, slug)).get()!;

describe('listing columns kept by triggers', () => {
	it('lists the newest submitted revision until one is approved, then the approved one', () => {
		const r1 = designAt(author, 'Listing trigger probe', 2.45e9, [2.4e9, 2.5e9]);
		const slug = 'listing-trigger-probe';
		expect(listed(slug).listedRevisionId).toBe(r1.id);
		submitReview(
			reviewer,
			r1.id,
			{ verdict: 'approve', summary: 'Built and checked.' },
			{ notify: false }
		);
		const r2 = startRevision(author, getDesignBySlug(slug)!);
		expect(listed(slug).listedRevisionId).toBe(r1.id); // a draft is never listed
		submitRevision(author, r2.id);
		// r1 is approved and shown; the newer submitted r2 waits for review and is not listed.
		expect(listed(slug).listedRevisionId).toBe(r1.id);
		const hit = searchDesigns({ q: 'listing trigger probe' }).items.find((i) => i.slug === slug)!;
		expect(hit.revisionNumber).toBe(1);
		expect(hit.reviewed).toBe(true);
		// Any writer of shown_revision_id (not only the review code) leaves the listing right.
		db.update(designs).set({ shownRevisionId: null }).where(eq(designs.slug, slug)).run();
		expect(listed(slug).listedRevisionId).toBe(r2.id);
	});

	it('counts build reports per design and sorts by them', async () => {
		const a = designAt(author, 'Reports sort alpha', 868e6, [863e6, 873e6]);
		const b = designAt(author, 'Reports sort beta', 868e6, [863e6, 873e6]);
		await addMeasurement(builder, b, sweep(868));
		await addMeasurement(builder, b, sweep(866));
		await addMeasurement(builder, a, sweep(868));
		await addMeasurement(author, a, sweep(868)); // the author's own sweep is a measurement, not a report
		expect(listed('reports-sort-beta').buildReports).toBe(2);
		expect(listed('reports-sort-alpha').buildReports).toBe(1);
		const sorted = searchDesigns({ q: 'reports sort', sort: 'reports' }).items.map((i) => [
			i.slug,
			i.buildReports
		]);
		expect(sorted).toEqual([
			['reports-sort-beta', 2],
			['reports-sort-alpha', 1]
		]);
	});
});

describe('search paging and snippets', () => {
	it('pages a match with a stable total and a snippet on every row of every page', () => {
		for (let i = 0; i < 7; i++) designAt(author, `Paging probe ${i}`, 435e6, [430e6, 440e6]);
		const first = searchDesigns({ q: 'paging probe', pageSize: 3, page: 1 });
		const third = searchDesigns({ q: 'paging probe', pageSize: 3, page: 3 });
		expect(first.total).toBe(7);
		expect(third.total).toBe(7);
		expect(first.items).toHaveLength(3);
		expect(third.items).toHaveLength(1);
		const all = [1, 2, 3].flatMap(
			(page) => searchDesigns({ q: 'paging probe', pageSize: 3, page }).items
		);
		expect(new Set(all.map((i) => i.slug)).size).toBe(7);
		for (const item of all) expect(item.snippet?.some((p) => p.hit)).toBe(true);
	});

	it('filters without a query by band and family, newest first, with no snippet', () => {
		const found = searchDesigns({ band: [430e6, 440e6], family: 'biquad' });
		expect(found.total).toBe(7);
		expect(found.items.every((i) => i.snippet === null)).toBe(true);
		const times = found.items.map((i) => i.createdAt);
		expect([...times].sort().reverse()).toEqual(times);
		expect(searchDesigns({ band: [430e6, 440e6], family: 'patch' }).total).toBe(0);
	});
});

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '../db';
import { designs, measurements, revisions, users } from '../db/schema';
import { seedDemo } from './demo';
import { SYNTHETIC_NOTE } from './measurements';
import { tempStore, type TempStore } from '../../testing/server-setup';

let temp: TempStore;
beforeAll(async () => {
	temp = await tempStore();
	await seedDemo(() => undefined);
});
afterAll(() => temp.cleanup());

describe('demo sweeps', () => {
	it('are synthetic, say so, are marked as demo data and have their files stored', async () => {
		const rows = db.select().from(measurements).all();
		expect(rows.length).toBeGreaterThanOrEqual(8);
		for (const m of rows) {
			expect(m.isDemo).toBe(true);
			expect(m.notes).toContain(SYNTHETIC_NOTE);
			const text = new TextDecoder().decode((await temp.store.get(m.fileKey))!);
			expect(text).toMatch(/^[!#] Bandwright demo data: synthetic sweep/);
		}
	});

	it('include a build report by another member that misses the claim on waveguide-feed-1g3 r1', () => {
		const found = db
			.select({
				m: measurements,
				email: users.email,
				number: revisions.number,
				owner: designs.ownerId
			})
			.from(measurements)
			.innerJoin(revisions, eq(revisions.id, measurements.revisionId))
			.innerJoin(designs, eq(designs.id, revisions.designId))
			.innerJoin(users, eq(users.id, measurements.uploaderId))
			.where(eq(designs.slug, 'waveguide-feed-1g3'))
			.all();
		const report = found.find((x) => x.m.kind === 'build_report');
		expect(report?.number).toBe(1);
		expect(report?.m.claimPass).toBe(false);
		expect(report?.m.uploaderId).not.toBe(report?.owner);
		expect(found.find((x) => x.m.kind === 'measurement')?.m.claimPass).toBe(true);
	});
});

import { beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { createAccount } from '../accounts/accounts';
import { toSessionUser, type SessionUser } from '../accounts/auth';
import { db } from '../db';
import { measurements, users } from '../db/schema';
import { createDesign, starterContent } from '../designs/designs';
import { getDesignBySlug } from '../designs/lookups';
import { saveDraft, startRevision, submitRevision } from '../designs/revisions';
import { getRevision } from '../designs/lookups';
import { compareRevisions, mainBand, measurementShift, resolveCompare } from './compare';
import { DomainError } from '../http/errors';
import type { RevisionContent } from '$lib/schemas/design';

let author: SessionUser;
let stranger: SessionUser;

async function member(email: string) {
	const a = (await createAccount({
		email,
		displayName: email.split('@')[0],
		password: 'long enough pass'
	}))!;
	db.update(users).set({ emailVerifiedAt: new Date() }).where(eq(users.id, a.id)).run();
	return toSessionUser(db.select().from(users).where(eq(users.id, a.id)).get()!);
}

// r1 cuts a quarter wave for 2.45 GHz whatever the target; r2 for the target frequency itself.
const fixed = (notes: string): RevisionContent => ({
	...starterContent(2.45e9),
	parameters: [{ key: 'vf', label: 'Velocity factor', value: 1 }],
	rows: [
		{
			key: 'quarter',
			label: 'Quarter wave',
			formula: 'c / (4 * 2.45 GHz)',
			kind: 'resonant',
			tolerance_mm: 0.5
		},
		{ key: 'wire', label: 'Wire', formula: '1.6 mm', kind: 'material' },
		{ key: 'gone', label: 'Removed later', formula: 'lambda / 10', kind: 'structural' }
	],
	notes,
	change_note: 'first'
});
const scaled = (notes: string): RevisionContent => ({
	...fixed(notes),
	design_frequency_hz: 5.8e9,
	parameters: [{ key: 'vf', label: 'Velocity factor', value: 0.95 }],
	rows: [
		{
			key: 'quarter',
			label: 'Quarter wave',
			formula: 'lambda / 4',
			kind: 'resonant',
			tolerance_mm: 0.5
		},
		{ key: 'wire', label: 'Wire', formula: '1.6 mm', kind: 'material' },
		{ key: 'added', label: 'New row', formula: 'lambda / 2', kind: 'structural' }
	],
	claim: { centre_hz: 5.8e9, band_lo_hz: 5.725e9, band_hi_hz: 5.875e9, vswr_max: 2 },
	change_note: 'second'
});

let slug = '';
beforeAll(async () => {
	author = await member('cmp-author@example.org');
	stranger = await member('cmp-stranger@example.org');
	const created = createDesign(
		author,
		{ title: 'Compare test', family: 'dipole', polarization: 'linear', summary: '' },
		fixed('Cut the wire to 30.6 mm.\nSolder it.')
	);
	slug = created.slug;
	submitRevision(author, created.revisionId);
	const design = getDesignBySlug(slug)!;
	const r2 = startRevision(author, design);
	saveDraft(author, r2.id, scaled('Cut the wire to 12.9 mm.\nSolder it.'));
	submitRevision(author, r2.id);
	startRevision(author, design); // r3 stays a private draft
});

describe('compareRevisions', () => {
	it('gives old → new values at the chosen frequency with absolute and % change', () => {
		const design = getDesignBySlug(slug)!;
		const d = compareRevisions(getRevision(design.id, 1)!, getRevision(design.id, 2)!, 5.8e9);
		const q = d.rows.find((r) => r.key === 'quarter')!;
		expect(q.change).toBe('formula');
		// [calc] λ/4 = c/(4f), c = 299 792 458 m/s (SI Brochure 9th ed.): 2.45 GHz → 30.5911 mm, 5.8 GHz → 12.9221 mm
		expect(q.value_from_mm).toBeCloseTo(30.5911, 3);
		expect(q.value_to_mm).toBeCloseTo(12.9221, 3);
		// [calc] 12.9221 − 30.5911 = −17.6690 mm; (2.45/5.8 − 1) × 100 = −57.7586 %
		expect(q.delta_mm).toBeCloseTo(-17.669, 3);
		expect(q.delta_pct).toBeCloseTo(-57.7586, 3);
		expect(q.exceeds_tolerance).toBe(true);
		expect(d.rows.find((r) => r.key === 'wire')!.change).toBe('unchanged');
		expect(d.rows.find((r) => r.key === 'added')!.change).toBe('added');
		expect(d.rows.find((r) => r.key === 'gone')!.change).toBe('removed');
	});

	it('diffs parameters, claims and notes word by word', () => {
		const design = getDesignBySlug(slug)!;
		const d = compareRevisions(getRevision(design.id, 1)!, getRevision(design.id, 2)!, 2.45e9);
		const vf = d.parameters.find((p) => p.key === 'vf')!;
		expect([vf.change, vf.from?.value, vf.to?.value]).toEqual(['changed', 1, 0.95]);
		expect(d.parameters.find((p) => p.key === 'design_frequency')!.to?.value).toBe(5.8e9);
		expect(d.claims.find((c) => c.key === 'centre_hz')).toMatchObject({
			change: 'changed',
			from: 2.45e9,
			to: 5.8e9
		});
		expect(d.notes.filter((p) => p.op === 'delete').map((p) => p.text.trim())).toContain('30.6');
		expect(d.notes.filter((p) => p.op === 'insert').map((p) => p.text.trim())).toContain('12.9');
		expect(d.notesSideBySide.filter((r) => r.changed)).toHaveLength(1);
		expect(d.measurements.message).toBe('no sweeps');
	});

	it('the same revision on both sides shows no change', () => {
		const design = getDesignBySlug(slug)!;
		const r = getRevision(design.id, 2)!;
		const d = compareRevisions(r, r, 5.8e9);
		expect(d.same).toBe(true);
		expect(d.rows.every((row) => row.change === 'unchanged')).toBe(true);
		expect(d.notes.every((p) => p.op === 'equal')).toBe(true);
	});
});

describe('resolveCompare', () => {
	it('defaults to the newest readable revision and its predecessor, at its design frequency', () => {
		const design = getDesignBySlug(slug)!;
		const anon = resolveCompare(design, { from: null, to: null, f: null }, null);
		expect([anon.from.number, anon.to.number, anon.hz]).toEqual([1, 2, 5.8e9]);
		const own = resolveCompare(design, { from: null, to: null, f: '2.45 GHz' }, author);
		expect([own.from.number, own.to.number, own.hz]).toEqual([2, 3, 2.45e9]);
	});

	it('404s for a number that does not exist and for someone else’s draft; 400 for junk', () => {
		const design = getDesignBySlug(slug)!;
		const status = (
			q: { from: string | null; to: string | null; f: string | null },
			u: SessionUser | null
		) => {
			try {
				resolveCompare(design, q, u);
			} catch (e) {
				expect(e).toBeInstanceOf(DomainError);
				return (e as DomainError).status;
			}
			return 200;
		};
		expect(status({ from: '1', to: '9', f: null }, null)).toBe(404);
		expect(status({ from: '1', to: '3', f: null }, stranger)).toBe(404);
		expect(status({ from: '1', to: '3', f: null }, author)).toBe(200);
		expect(status({ from: 'x', to: '2', f: null }, null)).toBe(400);
		expect(status({ from: '1', to: '2', f: 'loud' }, null)).toBe(400);
	});
});

describe('measured resonance shift', () => {
	it('picks the VSWR ≤ 2 band that holds the minimum', () => {
		expect(
			mainBand(
				[
					[1e9, 1.1e9],
					[2.4e9, 2.5e9]
				],
				2.45e9
			)
		).toEqual([2.4e9, 2.5e9]);
		expect(
			mainBand(
				[
					[1e9, 1.3e9],
					[2.4e9, 2.5e9]
				],
				null
			)
		).toEqual([1e9, 1.3e9]);
		expect(mainBand('nonsense', 1)).toBeNull();
	});

	it('subtracts the older sweep from the newer one, and says when one is missing', () => {
		const a = {
			measurementId: 'a',
			createdAt: '',
			f_min_vswr_hz: 2.44e9,
			band_vswr_2: [2.4e9, 2.48e9] as [number, number]
		};
		const b = {
			measurementId: 'b',
			createdAt: '',
			f_min_vswr_hz: 2.452e9,
			band_vswr_2: [2.41e9, 2.5e9] as [number, number]
		};
		const s = measurementShift(a, b);
		expect(s.shift_min_hz).toBeCloseTo(12e6, 0);
		expect(s.shift_band_lo_hz).toBeCloseTo(10e6, 0);
		expect(s.shift_band_hi_hz).toBeCloseTo(20e6, 0);
		expect(measurementShift(a, null).message).toContain('no sweeps');
	});

	it('reads the newest stored sweep of each revision', () => {
		const design = getDesignBySlug(slug)!;
		const [r1, r2] = [getRevision(design.id, 1)!, getRevision(design.id, 2)!];
		const sweep = (id: string, revisionId: string, fMin: number, at: number) =>
			db
				.insert(measurements)
				.values({
					id,
					revisionId,
					uploaderId: author.id,
					kind: 'measurement',
					instrument: 'vna',
					fileKey: id,
					fileName: `${id}.s1p`,
					fileType: 'touchstone',
					fileSize: 1,
					analysis: { f_min_vswr_hz: fMin, bands_vswr_2: [[fMin - 5e7, fMin + 5e7]] },
					createdAt: new Date(at)
				})
				.run();
		sweep('m-old', r1.id, 2.3e9, 1000);
		sweep('m-new', r1.id, 2.4e9, 2000);
		sweep('m-r2', r2.id, 5.7e9, 3000);
		const d = compareRevisions(r1, r2, 5.8e9);
		expect(d.measurements.from?.measurementId).toBe('m-new');
		expect(d.measurements.shift_min_hz).toBeCloseTo(3.3e9, 0);
	});
});

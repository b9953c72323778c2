import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '../db';
import { auditLog, measurements, revisions } from '../db/schema';
import type { SessionUser } from '../accounts/auth';
import { getDesignBySlug, getRevisionById } from '../designs/lookups';
import {
	addMeasurement,
	analyzeBytes,
	getMeasurement,
	measurementSeries,
	MAX_SWEEP_BYTES
} from './measurements';
import { measurementsPanelData } from './panel';
import { UploadError } from './uploads';
import { jpegWithGps, resonanceRows, solidPng, touchstone } from '../../testing/upload-fixtures';
import { designAt, member, rowCounts, tempStore, type TempStore } from '../../testing/server-setup';

let author: SessionUser;
let builder: SessionUser;
let unverified: SessionUser;
let temp: TempStore;

const fixture = (name: string) =>
	readFileSync(new URL(`../../testing/sweeps/${name}`, import.meta.url));
const bytes = (s: string) => new TextEncoder().encode(s);
const fields = {
	instrument: 'vna',
	reference_plane: 'SOL at the feed connector',
	measured_on: '2025-10-01',
	notes: 'n'
};

/**
 * Series RLC with R = Z0: Γ = jX/(2·Z0 + jX), so VSWR = 2 where |Γ| = 1/3, i.e. X = Z0/√2.
 * With X = Q·Z0·(u − 1/u), u = f/f0: u − 1/u = 1/(Q√2) → u = (a + √(a² + 4))/2 with a = 1/(Q√2).
 * [calc] from Pozar 4th ed. §2.3 relations (VSWR, Γ) and the series RLC impedance.
 */
function vswr2Edges(f0: number, q: number): [number, number] {
	const a = 1 / (q * Math.SQRT2);
	const u = (a + Math.sqrt(a * a + 4)) / 2;
	return [f0 / u, f0 * u];
}

beforeAll(async () => {
	author = await member('sweep-author@example.org');
	builder = await member('sweep-builder@example.org');
	unverified = await member('sweep-unverified@example.org', false);
	temp = await tempStore();
});
afterAll(() => temp.cleanup());

async function expectRefused(
	run: () => Promise<unknown>,
	status: number,
	message: RegExp,
	line?: number
) {
	const before = rowCounts();
	const blobs = (await temp.files()).length;
	let caught: unknown;
	try {
		await run();
	} catch (e) {
		caught = e;
	}
	expect(caught).toBeInstanceOf(UploadError);
	const err = caught as UploadError;
	expect(err.status).toBe(status);
	expect(err.message).toMatch(message);
	if (line !== undefined) expect(err.line).toBe(line);
	expect(rowCounts()).toEqual(before);
	expect((await temp.files()).length).toBe(blobs);
	return err;
}

describe('measurements on a revision', () => {
	it("stores the author's sweep with its claim check, the original file and an audit entry", async () => {
		const r = designAt(author, 'Sweep pass test', 2.45e9, [2.4e9, 2.5e9]);
		const file = touchstone(resonanceRows(2450, 8, 50, 2200, 2700, 501));
		const made = await addMeasurement(author, r, {
			fields,
			file: { bytes: bytes(file), name: '../../etc/my sweep!.txt' }
		});
		expect(made.kind).toBe('measurement');
		const row = getMeasurement(made.id)!;
		expect(row.claimPass).toBe(true);
		expect(row.fileName).toBe('my sweep.s1p');
		expect(row.fileType).toBe('text/plain; charset=utf-8');
		expect(new TextDecoder().decode((await temp.store.get(row.fileKey))!)).toBe(file);
		const [lo, hi] = vswr2Edges(2450e6, 8);
		const band = (row.analysis as { bands_vswr_2: [number, number][] }).bands_vswr_2[0];
		// 1 MHz: sample spacing of the test sweep, linear interpolation of the edges
		expect(band[0]).toBeCloseTo(lo, -6);
		expect(Math.abs(band[0] - lo)).toBeLessThan(1e6);
		expect(Math.abs(band[1] - hi)).toBeLessThan(1e6);
		const entry = db.select().from(auditLog).where(eq(auditLog.targetId, made.id)).get();
		expect(entry?.action).toBe('measurement.add');
	});

	it('files a build report on another member’s submitted revision and says by how much it misses', async () => {
		const r = designAt(author, 'Sweep miss test', 2.45e9, [2.4e9, 2.5e9]);
		// resonance at 2300 MHz: the VSWR ≤ 2 band ends below 2500 MHz
		const file = touchstone(resonanceRows(2300, 8, 50, 2100, 2600, 501));
		const made = await addMeasurement(builder, r, {
			fields: {
				...fields,
				target_frequency: '2.45 GHz',
				deviations: 'none',
				materials: '1.6 mm copper'
			},
			file: { bytes: bytes(file), name: 'built.s1p' }
		});
		expect(made.kind).toBe('build_report');
		expect(made.claimPass).toBe(false);
		const row = getMeasurement(made.id)!;
		const claim = (row.analysis as { claim: { miss_lo_hz: number; miss_hi_hz: number } }).claim;
		const [, hi] = vswr2Edges(2300e6, 8);
		expect(claim.miss_lo_hz).toBe(0);
		expect(Math.abs(claim.miss_hi_hz - (2.5e9 - hi))).toBeLessThan(1e6);
		expect(row.targetHz).toBe(2.45e9);
		const panel = measurementsPanelData(
			getDesignBySlug('sweep-miss-test')!,
			r,
			null
		).measurementsPanel;
		expect(panel.onRevision.buildReports).toEqual({ total: 1, pass: 0 });
		expect(panel.items[0].unreviewedBase).toBe(true);
		expect(panel.upload).toBeNull();
	});

	it('moves the claim to a build report’s target frequency (same fractional band)', async () => {
		const r = designAt(author, 'Sweep scaled test', 2.45e9, [2.4e9, 2.5e9]);
		// built at 5.8 GHz: claim 2.4–2.5 GHz × 5.8/2.45 [calc]
		const file = touchstone(resonanceRows(5800, 8, 50, 5200, 6400, 601));
		const made = await addMeasurement(builder, r, {
			fields: { ...fields, target_frequency: '5.8 GHz' },
			file: { bytes: bytes(file), name: 'moved.s1p' }
		});
		const a = getMeasurement(made.id)!.analysis as {
			claim_used: { band_lo_hz: number; scaled: boolean };
			design_hz: number;
		};
		expect(a.claim_used.scaled).toBe(true);
		expect(a.claim_used.band_lo_hz).toBeCloseTo((2.4e9 * 5.8) / 2.45, 0);
		expect(a.design_hz).toBeCloseTo(5.8e9, 0);
		expect(made.claimPass).toBe(true);
	});

	it('refuses uploads the rules do not allow, storing nothing', async () => {
		const draft = designAt(author, 'Sweep draft test', 2.45e9, [2.4e9, 2.5e9], false);
		const file = {
			bytes: bytes(touchstone(resonanceRows(2450, 8, 50, 2200, 2700))),
			name: 'a.s1p'
		};
		await expectRefused(() => addMeasurement(builder, draft, { fields, file }), 409, /draft/);
		await expectRefused(
			() => addMeasurement(unverified, draft, { fields, file }),
			403,
			/Verify your e-mail/
		);
		const returned = designAt(author, 'Sweep returned test', 2.45e9, [2.4e9, 2.5e9]);
		db.update(revisions).set({ state: 'returned' }).where(eq(revisions.id, returned.id)).run();
		await expectRefused(
			() => addMeasurement(builder, getRevisionById(returned.id)!, { fields, file }),
			409,
			/returned/
		);
		// a build report needs the target frequency it was built for
		await expectRefused(
			() => addMeasurement(builder, returnedOk(), { fields, file }),
			400,
			/Target frequency is required/
		);
		await expectRefused(
			() =>
				addMeasurement(author, draft, { fields: { ...fields, instrument: 'oscilloscope' }, file }),
			400,
			/instrument/
		);
		await expectRefused(
			() =>
				addMeasurement(author, draft, { fields: { ...fields, measured_on: '2999-01-01' }, file }),
			400,
			/future/
		);
	});

	it('removes the stored file again when the row cannot be written', async () => {
		const r = designAt(author, 'Sweep orphan test', 2.45e9, [2.4e9, 2.5e9]);
		const ghost = { ...r, id: 'no-such-revision-id' };
		const file = {
			bytes: bytes(touchstone(resonanceRows(2450, 8, 50, 2200, 2700))),
			name: 'a.s1p'
		};
		const blobs = (await temp.files()).length;
		await expect(addMeasurement(author, ghost, { fields, file })).rejects.toThrow(/FOREIGN KEY/);
		expect((await temp.files()).length).toBe(blobs);
		expect(
			db.select().from(measurements).where(eq(measurements.revisionId, ghost.id)).all()
		).toHaveLength(0);
	});
});

let okRevision: ReturnType<typeof designAt> | null = null;
function returnedOk() {
	okRevision ??= designAt(author, 'Sweep report target test', 2.45e9, [2.4e9, 2.5e9]);
	return okRevision;
}

describe('bad sweep files', () => {
	let r: ReturnType<typeof designAt>;
	beforeAll(() => {
		r = designAt(author, 'Sweep bad input test', 2.45e9, [2.4e9, 2.5e9]);
	});
	const upload = (content: Uint8Array | string, name = 'sweep.s1p') =>
		addMeasurement(author, r, {
			fields,
			file: { bytes: typeof content === 'string' ? bytes(content) : content, name }
		});

	it('an empty file', async () => {
		await expectRefused(() => upload(''), 422, /empty/);
		await expectRefused(() => upload('  \n\n'), 422, /empty/);
	});

	it('binary junk, located', async () => {
		const junk = new Uint8Array([0x41, 0x0a, 0x00, 0x13, 0xfe, 0x80, 0x02]);
		await expectRefused(() => upload(junk), 422, /not a text file/, 2);
	});

	it('a Touchstone file with more than 2 ports', async () => {
		// Touchstone 1.1: a 3-port file's first data line holds the frequency and 3 pairs
		const three = '# GHz S MA R 50\n1 0.5 0 0.1 0 0.1 0\n 0.1 0 0.5 0 0.1 0\n 0.1 0 0.1 0 0.5 0\n';
		await expectRefused(() => upload(three, 'three.s3p'), 422, /only 1-port and 2-port/i, 2);
	});

	it('S22 asked of a 1-port file names the parameter field', async () => {
		const err = await expectRefused(
			() =>
				addMeasurement(author, r, {
					fields: { ...fields, parameter: 's22' },
					file: { bytes: bytes('# MHz S MA R 50\n2.0 0.5 10\n'), name: 'one.s1p' }
				}),
			422,
			/S22 was asked for, but this is a 1-port file/
		);
		expect(err.field).toBe('parameter');
		await expectRefused(
			() =>
				addMeasurement(author, r, {
					fields: { ...fields, parameter: 's21' },
					file: { bytes: bytes('# MHz S MA R 50\n2.0 0.5 10\n'), name: 'one.s1p' }
				}),
			400,
			/Parameter must be one of s11, s22/
		);
	});

	it('an option line after data', async () => {
		await expectRefused(
			() => upload('! x\n2.0 0.5 10\n# MHz S MA R 50\n2.1 0.5 10\n'),
			422,
			/option line after data/i,
			3
		);
	});

	it('magnitudes above 1.05 at most points in MA (not passive)', async () => {
		// Touchstone MA: magnitude is |S11|; a passive 1-port has |S11| ≤ 1 (Pozar 4th ed. §4.3)
		await expectRefused(
			() => upload('# MHz S MA R 50\n2.0 0.5 10\n2.1 1.5 10\n2.2 1.4 10\n'),
			422,
			/^Not a passive one-port/,
			3
		);
	});

	it('frequencies decreasing', async () => {
		// Touchstone 1.1: frequencies increase
		await expectRefused(
			() => upload('# MHz S MA R 50\n2.1 0.5 10\n2.0 0.5 10\n'),
			422,
			/increase/,
			3
		);
	});

	it('200 001 points', async () => {
		const lines = ['# Hz S RI R 50'];
		for (let i = 0; i < 200_001; i++) lines.push(`${1e6 + i} 0.1 0.1`);
		await expectRefused(() => upload(lines.join('\n')), 422, /200 000/, 200_002);
	});

	it('a JPEG named .s1p is refused as an image', async () => {
		const jpeg = await jpegWithGps(40, 30);
		await expectRefused(() => upload(jpeg, 'sweep.s1p'), 415, /this is an image/i);
		const png = await solidPng(8, 8);
		await expectRefused(() => upload(png, 'sweep.csv'), 415, /PNG image/);
	});

	it('a file of 11 MB', async () => {
		const big = new Uint8Array(11 * 1024 * 1024).fill(0x31);
		const err = await expectRefused(() => upload(big), 413, /11\.0 MB.*at most 10 MB/);
		expect(err.field).toBe('file');
		expect(big.byteLength).toBeGreaterThan(MAX_SWEEP_BYTES);
	});

	it('a CSV with semicolons and decimal commas parses', async () => {
		const made = await upload(fixture('semicolon-decimal-comma.csv'), 'export.csv');
		const row = getMeasurement(made.id)!;
		expect(row.fileName).toBe('export.csv');
		expect((row.analysis as { points: number }).points).toBe(3);
	});
});

describe('files from real instruments: stored with their warnings', () => {
	let r: ReturnType<typeof designAt>;
	beforeAll(() => {
		r = designAt(author, 'Sweep quirks test', 2.45e9, [2.4e9, 2.5e9]);
	});
	// resonance at 2450 MHz, Q 8, R = Z0: far from it |S11| nears 1 (0.9926 at 1 and 6 GHz [calc])
	const rows = resonanceRows(2450, 8, 50, 1000, 6000, 501);

	it('calibration noise above |S11| = 1: kept in the analysis, the metrics, the panel and the series', async () => {
		const noisy = rows.map(([f, m, a]): [number, number, number] => [
			f,
			m > 0.99 ? m * 1.008 : m,
			a
		]);
		const above = noisy.filter((x) => x[1] > 1);
		expect(above.length).toBeGreaterThan(4);
		const made = await addMeasurement(author, r, {
			fields,
			file: { bytes: bytes(touchstone(noisy)), name: 'open-ended.s1p' }
		});
		expect(made.claimPass).toBe(true);
		const row = getMeasurement(made.id)!;
		const warning = {
			code: 'above_unity',
			count: above.length,
			max_excess: expect.closeTo(Math.max(...above.map((x) => x[1])) - 1, 9),
			frequency_hz: expect.any(Number),
			message: expect.stringMatching(/calibration noise/)
		};
		expect((row.analysis as { warnings: unknown[] }).warnings).toEqual([warning]);
		// the listing column kept by the trigger (drizzle/0003) carries them too
		expect((row.metrics as { warnings: unknown[] }).warnings).toEqual([warning]);
		const panel = measurementsPanelData(getDesignBySlug('sweep-quirks-test')!, r, null);
		expect(panel.measurementsPanel.items.at(-1)!.warnings).toEqual([warning]);
		expect(measurementSeries(row, 'x').warnings).toEqual([warning]);
	});

	it('a 2-port file: S22 when asked, stored as .s2p with a note saying which parameter was used', async () => {
		const other = resonanceRows(2300, 8, 50, 1000, 6000, 501);
		const lines = rows.map(
			(x, i) => `${x[0]} ${x[1]} ${x[2]} 0.1 0 0.1 0 ${other[i][1]} ${other[i][2]}`
		);
		const text = ['# MHz S MA R 50', ...lines].join('\n');
		const s11 = await addMeasurement(author, r, {
			fields,
			file: { bytes: bytes(text), name: 'dual.s2p' }
		});
		expect(s11.claimPass).toBe(true);
		const s22 = await addMeasurement(author, r, {
			fields: { ...fields, parameter: 's22' },
			file: { bytes: bytes(text), name: 'dual.s2p' }
		});
		expect(s22.claimPass).toBe(false); // the 2300 MHz resonance misses 2.4–2.5 GHz
		const row = getMeasurement(s22.id)!;
		expect(row.fileName).toBe('dual.s2p');
		const notes = (row.analysis as { warnings: { code: string; message: string }[] }).warnings;
		expect(notes).toHaveLength(1);
		expect(notes[0].code).toBe('two_port_parameter');
		expect(notes[0].message).toMatch(/^2-port file: S22/);
	});

	it('the analyze path returns the same warnings for a Z file, storing nothing', () => {
		const before = rowCounts();
		const result = analyzeBytes(bytes('# MHz Z RI R 50\n2400 1 -0.5\n2450 1 0\n2500 1 0.5\n'), {
			format: 'auto',
			design_hz: 2450e6
		});
		// [calc] z = 1 (Z = R) at 2450 MHz: Γ = 0, VSWR 1
		expect(result.vswr_at_design).toBeCloseTo(1, 12);
		expect(result.warnings.map((w) => w.code)).toEqual(['converted_from_z']);
		expect(rowCounts()).toEqual(before);
	});
});

describe('analyze without storing', () => {
	it('reads the semicolon CSV: return loss 13.979 dB is VSWR 1.5 at 2450.5 MHz', () => {
		// RL 13.979 dB ↔ VSWR 1.5 (Pozar 4th ed. §2.3; CHECKS.md table)
		const before = rowCounts();
		const result = analyzeBytes(fixture('semicolon-decimal-comma.csv'), {
			format: 'auto',
			design_hz: 2450.5e6
		});
		expect(result.vswr_at_design).toBeCloseTo(1.5, 3);
		expect(rowCounts()).toEqual(before);
	});

	it('answers 400 naming the field for a bad option, 422 with a line for bad data', () => {
		const csv = 'f_hz,x\n1,2\n';
		expect(() => analyzeBytes(bytes(csv), { format: 'auto', z0: -1 })).toThrowError(UploadError);
		try {
			analyzeBytes(bytes(csv), { format: 'auto', z0: -1 });
		} catch (e) {
			expect((e as UploadError).status).toBe(400);
			expect((e as UploadError).field).toBe('z0');
		}
	});
});

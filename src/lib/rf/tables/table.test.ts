import { describe, expect, it } from 'vitest';
import { C } from '../units/constants';
import { formulaCacheStats } from '../formulas/formula';
import { patchLength } from '../formulas/families';
import {
	TableInputError,
	compileTable,
	computeTable,
	evaluateTable,
	type RowResult,
	type TableDefinition,
	type TableResult
} from './table';

const row = (r: TableResult, key: string): RowResult => {
	const found = r.rows.find((x) => x.key === key);
	if (!found) throw new Error(`no row ${key}`);
	return found;
};

// Invented demo table (not a published design): a biquad-like mix of resonant and stock rows.
const DEMO: TableDefinition = {
	parameters: [
		{ key: 'er', value: 2.2 },
		{ key: 'h', value: '1.6 mm' },
		{ key: 'wire_d', value: '2 mm', valid_ratio: { of: 'lambda', min: 0.005, max: 0.02 } }
	],
	rows: [
		{ key: 'quarter', formula: 'lambda / 4', kind: 'resonant' },
		{ key: 'side', formula: 'quarter + wire_d / 2', kind: 'resonant' },
		{ key: 'refl', formula: '0.9 * lambda', kind: 'structural' },
		{ key: 'wire', formula: 'wire_d', kind: 'material', catalogue: 'awg' },
		{ key: 'board', formula: 'h * 0.95', kind: 'material', catalogue: 'pcb_thickness' },
		{ key: 'patch', formula: 'patch_length(f, er, board)', kind: 'resonant' },
		{ key: 'turns', formula: '7.4', kind: 'count' },
		{ key: 'pitch', formula: '14 deg', kind: 'structural' },
		{ key: 'ratio', formula: 'side / quarter', kind: 'structural' }
	]
};

describe('wavelength rows', () => {
	it('quarter wavelength at 2.45 and 5.8 GHz', () => {
		// [calc] λ/4 = c/(4f): 2.45 GHz → 30.5911 mm, 5.8 GHz → 12.9221 mm (CHECKS.md).
		expect(row(computeTable(DEMO, { frequencyHz: 2.45e9 }), 'quarter').value_mm).toBeCloseTo(
			30.5911,
			4
		);
		const at58 = computeTable(DEMO, { frequencyHz: 5.8e9 });
		expect(row(at58, 'quarter').value_mm).toBeCloseTo(12.9221, 4);
		// Common practice: a quarter-wave balun slot of about 12.9 mm at 5.8 GHz.
		expect(row(at58, 'quarter').value_mm).toBeCloseTo(12.9, 1);
		// [calc] λ(5.8 GHz) = 51.6884 mm.
		expect(at58.wavelength_mm).toBeCloseTo(51.6884, 4);
	});

	it('rescaling 2.4 → 5.8 GHz scales wavelength rows and keeps stock rows', () => {
		const compiled = compileTable(DEMO);
		const a = evaluateTable(compiled, { frequencyHz: 2.4e9 });
		const b = evaluateTable(compiled, { frequencyHz: 5.8e9 });
		// [calc] a row proportional to λ scales by f1/f2 = 2.4/5.8.
		for (const key of ['quarter', 'refl']) {
			expect(row(b, key).value_mm! / row(a, key).value_mm!).toBeCloseTo(2.4 / 5.8, 12);
		}
		for (const key of ['wire', 'board']) {
			expect(row(b, key).stock).toEqual(row(a, key).stock);
		}
		// AWG 12 = 2.053 mm is nearest to 2 mm [calc ASTM B258]; 1.52 mm snaps to 1.6 mm laminate.
		expect(row(a, 'wire').stock?.name).toBe('AWG 12');
		expect(row(a, 'board').stock?.value_mm).toBeCloseTo(1.6, 9);
	});

	it('later rows use the stock value of a snapped row', () => {
		// [calc] Balanis §14.2 transmission-line model with h = 1.6 mm (the stock board), not 1.52 mm.
		const r = computeTable(DEMO, { frequencyHz: 2.45e9 });
		expect(row(r, 'patch').value_mm).toBeCloseTo(patchLength(2.45e9, 2.2, 1.6e-3) * 1000, 9);
	});
});

describe('row kinds and display', () => {
	const r = computeTable(DEMO, { frequencyHz: 2.4e9, units: 'in_frac' });

	it('count rows are integers and say they were rounded', () => {
		expect(row(r, 'turns').value).toBe(7);
		expect(row(r, 'turns').warnings).toContain('rounded from 7.4 to 7');
	});

	it('angles in degrees, ratios plain', () => {
		expect(row(r, 'pitch')).toMatchObject({ value: 14, unit: 'deg', display: '14.00°' });
		expect(row(r, 'ratio').unit).toBe('');
	});

	it('lengths in fractional inches', () => {
		// [calc] λ/4 at 2.4 GHz = 31.2284 mm = 1.22946 in → 79/64 = 1 15/64 in.
		expect(row(r, 'quarter')).toMatchObject({ unit: 'in', display: '1 15/64 in' });
		expect(row(r, 'quarter').value).toBeCloseTo(31.2284 / 25.4, 4);
	});

	it('decimal inches', () => {
		const inch = computeTable(DEMO, { frequencyHz: 2.4e9, units: 'in' });
		expect(row(inch, 'quarter').display).toBe('1.229 in');
	});
});

describe('snapping, sensitivity, validity', () => {
	it('a resonant row with a catalogue reports the shift the stock size causes', () => {
		// [calc] 2.4 GHz: λ/4 = 31.2284 mm → 30 mm standoff; Δf = −f ΔL/L = −2.4e9 × (−1.2284)/31.2284.
		const def: TableDefinition = {
			parameters: [],
			rows: [{ key: 'q', formula: 'lambda / 4', kind: 'resonant', catalogue: 'standoff' }]
		};
		const q = row(computeTable(def, { frequencyHz: 2.4e9 }), 'q');
		expect(q.stock?.name).toBe('30 mm standoff');
		expect(q.stock!.shift_hz! / 1e6).toBeCloseTo(94.41, 1);
	});

	it('sensitivity on resonant length rows only, marked first order', () => {
		// ITU RR 5.150 ISM band 2400–2500 MHz; [calc] 30.5911 mm × 50/2450 = 0.62431 mm; −8.0089 MHz/0.1 mm.
		const r = computeTable(DEMO, { frequencyHz: 2.45e9, bandHz: [2.4e9, 2.5e9] });
		expect(row(r, 'quarter').sensitivity).toMatchObject({ first_order: true });
		expect(row(r, 'quarter').sensitivity!.tolerance_mm).toBeCloseTo(0.62431, 4);
		expect(row(r, 'quarter').sensitivity!.hz_per_0_1mm / 1e6).toBeCloseTo(-8.0089, 3);
		expect(row(r, 'refl').sensitivity).toBeUndefined();
	});

	it('warns when the build tolerance is wider than the band allows', () => {
		const def: TableDefinition = {
			parameters: [],
			rows: [{ key: 'q', formula: 'lambda / 4', kind: 'resonant', tolerance_mm: 1 }]
		};
		const q = row(computeTable(def, { frequencyHz: 2.45e9, bandHz: [2.4e9, 2.5e9] }), 'q');
		expect(q.warnings.join(' ')).toMatch(/build tolerance ±1 mm is wider than the ±0\.624 mm/);
	});

	it('warns outside the measured ratio range', () => {
		// [calc] 2 mm / λ: 2.4 GHz 0.01601 (inside 0.005–0.02); 5.8 GHz 2 / 51.6884 = 0.0386934 (outside).
		expect(computeTable(DEMO, { frequencyHz: 2.4e9 }).parameters[2].warnings).toEqual([]);
		const w = computeTable(DEMO, { frequencyHz: 5.8e9 }).parameters[2].warnings;
		expect(w).toHaveLength(1);
		expect(w[0]).toContain('wire_d / lambda = 0.0386934');
		expect(w[0]).toContain('0.005 to 0.02');
	});

	it('a row valid_ratio against another key', () => {
		const def: TableDefinition = {
			parameters: [{ key: 'gap', value: '3 mm' }],
			rows: [
				{
					key: 'arm',
					formula: 'lambda / 2',
					kind: 'resonant',
					valid_ratio: { of: 'gap', min: 10, max: 30 }
				},
				{
					key: 'odd',
					formula: '1 mm',
					kind: 'structural',
					valid_ratio: { of: 'f', min: 0, max: 1 }
				}
			]
		};
		// [calc] λ/2 at 2.4 GHz = 62.4568 mm; / 3 mm = 20.8 (inside); at 1 GHz 49.97 (outside).
		expect(row(computeTable(def, { frequencyHz: 2.4e9 }), 'arm').warnings).toEqual([]);
		expect(row(computeTable(def, { frequencyHz: 1e9 }), 'arm').warnings[0]).toMatch(
			/arm \/ gap = 49\.9654/
		);
		expect(row(computeTable(def, { frequencyHz: 1e9 }), 'odd').warnings[0]).toMatch(
			/valid_ratio ignored/
		);
	});
});

describe('errors stay on their row', () => {
	const def: TableDefinition = {
		parameters: [
			{ key: 'good', value: '2 mm' },
			{ key: 'bad', value: '2 zorgs' }
		],
		rows: [
			{ key: 'a', formula: 'b * 2', kind: 'structural' },
			{ key: 'b', formula: 'a / 2', kind: 'structural' },
			{ key: 'me', formula: 'me + 1 mm', kind: 'structural' },
			{ key: 'freq', formula: 'f', kind: 'resonant' },
			{ key: 'n', formula: 'lambda', kind: 'count' },
			{ key: 'uses_bad', formula: 'bad + 1 mm', kind: 'structural' },
			{ key: 'fine', formula: 'good + lambda / 4', kind: 'resonant' },
			{ key: 'guide', formula: 'guide_wavelength(f, 5 mm)', kind: 'resonant' },
			{ key: 'after_guide', formula: 'guide / 4', kind: 'resonant' },
			{ key: 'inf', formula: 'lambda / (f / f - 1)', kind: 'structural' }
		]
	};
	const r = computeTable(def, { frequencyHz: 2.4e9 });

	it('forward reference and cycle', () => {
		expect(row(r, 'a').error?.message).toMatch(/"b" is row 2, defined later/);
		expect(row(r, 'a').error?.column).toBe(1);
		expect(row(r, 'b').error?.message).toBe('depends on a');
	});

	it('self reference', () => {
		expect(row(r, 'me').error).toEqual({ message: 'row "me" refers to itself', column: 1 });
	});

	it('wrong dimension for the kind', () => {
		expect(row(r, 'freq').error?.message).toBe(
			'a resonant row must give a length or an angle, but this gives frequency'
		);
		expect(row(r, 'n').error?.message).toMatch(/count row must give a plain number/);
	});

	it('parameter errors are reported and propagate', () => {
		expect(r.parameters[1].error).toEqual({ message: 'unknown name "zorgs"', column: 3 });
		expect(row(r, 'uses_bad').error?.message).toBe('depends on bad');
	});

	it('runtime errors (below cutoff, division by zero) and their dependants', () => {
		// [calc] a 5 mm guide has TE11 fc = 35.14 GHz, far above 2.4 GHz (Pozar §3.4 relation).
		expect(row(r, 'guide').error?.message).toMatch(/below the TE11 cutoff/);
		expect(row(r, 'after_guide').error?.message).toBe('depends on guide');
		expect(row(r, 'inf').error?.message).toMatch(/not a finite number/);
	});

	it('the rest of the table still computes, and the result is plain JSON', () => {
		// [calc] 2 mm + 31.2284 mm.
		expect(row(r, 'fine').value_mm).toBeCloseTo(33.2284, 4);
		expect(JSON.parse(JSON.stringify(r))).toEqual(r);
	});
});

describe('definition and option checks', () => {
	const one = (key: string): TableDefinition => ({
		parameters: [],
		rows: [{ key, formula: '1 mm', kind: 'structural' }]
	});

	it.each([['lambda'], ['sqrt'], ['mm'], ['GHz'], ['deg'], ['in'], ['1abc'], ['a-b']])(
		'rejects key %s',
		(key) => {
			expect(() => compileTable(one(key))).toThrow(TableInputError);
		}
	);

	it('accepts a key that is a unit of another quantity (h is also hours)', () => {
		expect(compileTable(one('h')).rows[0].error).toBeUndefined();
	});

	it('duplicate keys and too many rows', () => {
		const dup: TableDefinition = { parameters: [{ key: 'x', value: 1 }], rows: one('x').rows };
		expect(() => compileTable(dup)).toThrow(/duplicate key "x"/);
		const many: TableDefinition = {
			parameters: [],
			rows: Array.from({ length: 201 }, (_, i) => ({
				key: `r${i}`,
				formula: '1 mm',
				kind: 'structural' as const
			}))
		};
		expect(() => compileTable(many)).toThrow(/at most 200 rows/);
	});

	it.each([[0], [-1], [NaN], [Infinity], [2e12]])('rejects frequency %f', (f) => {
		expect(() => computeTable(one('x'), { frequencyHz: f })).toThrow(TableInputError);
	});

	it('rejects an inverted band', () => {
		expect(() => computeTable(one('x'), { frequencyHz: 1e9, bandHz: [2e9, 1e9] })).toThrow(/band/);
	});
});

describe('compile once', () => {
	it('evaluating at new frequencies does not parse again', () => {
		const compiled = compileTable(DEMO);
		const before = formulaCacheStats().parses;
		for (let i = 0; i < 50; i++) evaluateTable(compiled, { frequencyHz: 1e9 + i * 1e8 });
		compileTable(DEMO);
		expect(formulaCacheStats().parses).toBe(before);
	});

	it('c is the exact SI value in formulas', () => {
		// SI Brochure 9th ed.: c = 299 792 458 m/s; c / 1 GHz = 299.792458 mm.
		const def: TableDefinition = {
			parameters: [],
			rows: [{ key: 'x', formula: 'c / 1 GHz', kind: 'structural' }]
		};
		expect(row(computeTable(def, { frequencyHz: 1e9 }), 'x').value_mm).toBe((C / 1e9) * 1000);
	});
});

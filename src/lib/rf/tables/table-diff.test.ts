import { describe, expect, it } from 'vitest';
import { diffClaims, diffParameters, diffRows, diffTables, normalizeFormula } from './table-diff';
import type { DiffRow, TableSide } from './table-diff';

const row = (key: string, extra: Partial<DiffRow> = {}): DiffRow => ({
	key,
	label: key.replace(/_/g, ' '),
	formula: `${key}_formula`,
	kind: 'structural',
	...extra
});

const keysAndChange = (rows: ReturnType<typeof diffRows>) => rows.map((d) => [d.key, d.change]);

describe('diffRows', () => {
	it('reports added and removed rows and keeps removed rows near their old place', () => {
		const from = [row('a'), row('b'), row('c')];
		const to = [row('a'), row('c'), row('d')];
		const diff = diffRows(from, to);
		expect(keysAndChange(diff)).toEqual([
			['a', 'unchanged'],
			['b', 'removed'],
			['c', 'unchanged'],
			['d', 'added']
		]);
		const removed = diff[1];
		expect(removed.from?.key).toBe('b');
		expect(removed.to).toBeUndefined();
		expect([removed.position_from, removed.position_to]).toEqual([1, null]);
		expect([diff[3].position_from, diff[3].position_to]).toEqual([null, 2]);
	});

	it('marks only the rows that left their relative order as moved', () => {
		// An insertion at the top shifts every index but moves nothing.
		const shifted = diffRows([row('a'), row('b')], [row('x'), row('a'), row('b')]);
		expect(shifted.filter((d) => d.changes.includes('moved'))).toEqual([]);

		const moved = diffRows(
			[row('a'), row('b'), row('c'), row('d')],
			[row('a'), row('c'), row('d'), row('b')]
		);
		expect(moved.filter((d) => d.changes.includes('moved')).map((d) => d.key)).toEqual(['b']);
		const b = moved.find((d) => d.key === 'b');
		expect([b?.change, b?.position_from, b?.position_to]).toEqual(['moved', 1, 3]);
	});

	it('reports a renamed label without calling it a formula change', () => {
		const diff = diffRows(
			[row('driven', { label: 'Driven element' })],
			[row('driven', { label: 'Dipole arm' })]
		);
		expect(diff[0].change).toBe('label');
		expect(diff[0].changes).toEqual(['label']);
	});

	it('reports a formula change on the same key, ignoring whitespace-only edits', () => {
		const a = row('arm', { formula: 'lambda / 4' });
		expect(diffRows([a], [row('arm', { formula: 'lambda/4' })])[0].change).toBe('unchanged');
		const changed = diffRows([a], [row('arm', { formula: '0.95 * lambda / 4', label: 'Arm' })]);
		expect(changed[0].change).toBe('formula');
		expect(changed[0].changes).toEqual(['formula', 'label']);
	});

	it('keeps identifiers apart when normalizing formulas', () => {
		expect(normalizeFormula('a b')).not.toBe(normalizeFormula('ab'));
		expect(normalizeFormula(' sqrt( er ) * 2 ')).toBe('sqrt(er)*2');
	});

	it('reports unit, kind, catalogue and tolerance changes', () => {
		const from = [row('wire_d', { kind: 'structural', unit: 'mm' })];
		const to = [
			row('wire_d', { kind: 'material', catalogue: 'awg', unit: 'in', tolerance_mm: 0.1 })
		];
		const diff = diffRows(from, to);
		expect(diff[0].change).toBe('kind');
		expect(diff[0].changes).toEqual(['kind', 'catalogue', 'unit', 'tolerance']);
		expect(diffRows([row('x', { unit: 'mm' })], [row('x', { unit: 'in' })])[0].change).toBe('unit');
	});

	it('computes value change and percent', () => {
		// [calc] lambda/4 = c/(4 f): 2.45 GHz -> 30.5911 mm, 5.8 GHz -> 12.9221 mm (CHECKS.md, Constants)
		// delta = 12.9221 - 30.5911 = -17.669 mm; pct = -17.669 / 30.5911 * 100 = -57.759 %
		const diff = diffRows([row('arm')], [row('arm')], {
			valuesFrom: { arm: 30.5911 },
			valuesTo: { arm: 12.9221 }
		});
		expect(diff[0].delta_mm).toBeCloseTo(-17.669, 4);
		expect(diff[0].delta_pct).toBeCloseTo(-57.759, 3);
		expect(diff[0].change).toBe('value');
	});

	it('gives null deltas when a value is missing or the old value is zero', () => {
		const diff = diffRows([row('a'), row('b')], [row('a'), row('b')], {
			valuesFrom: { a: null, b: 0 },
			valuesTo: { a: 5, b: 2 }
		});
		expect([diff[0].delta_mm, diff[0].delta_pct]).toEqual([null, null]);
		expect([diff[1].delta_mm, diff[1].delta_pct]).toEqual([2, null]);
	});

	it('highlights a value change larger than the build tolerance', () => {
		const tol = { tolerance_mm: 0.2 };
		const diff = diffRows(
			[row('a', tol), row('b', tol), row('c')],
			[row('a', tol), row('b', tol), row('c')],
			{
				valuesFrom: { a: 30.0, b: 30.0, c: 30.0 },
				valuesTo: { a: 30.15, b: 30.25, c: 35 }
			}
		);
		expect(diff.map((d) => d.exceeds_tolerance)).toEqual([false, true, false]);
	});
});

describe('diffParameters and diffClaims', () => {
	it('diffs parameters by key', () => {
		const diff = diffParameters(
			[
				{ key: 'vf', value: 0.95 },
				{ key: 'er', value: 4.4 },
				{ key: 'h', value: 1.6, unit: 'mm' }
			],
			[
				{ key: 'vf', value: 0.95 },
				{ key: 'er', value: 3.66 },
				{ key: 'turns', value: 10 }
			]
		);
		expect(diff.map((d) => [d.key, d.change])).toEqual([
			['vf', 'unchanged'],
			['er', 'changed'],
			['turns', 'added'],
			['h', 'removed']
		]);
		expect([diff[1].from?.value, diff[1].to?.value]).toEqual([4.4, 3.66]);
	});

	it('diffs claims field by field', () => {
		const diff = diffClaims(
			{ centre_hz: 2.45e9, band_lo_hz: 2.4e9, band_hi_hz: 2.5e9, vswr_max: 2, gain_dbi: 10 },
			{
				centre_hz: 2.45e9,
				band_lo_hz: 2.4e9,
				band_hi_hz: 2.5e9,
				vswr_max: 1.5,
				gain_verified: true
			}
		);
		expect(diff.map((d) => [d.key, d.change])).toEqual([
			['centre_hz', 'unchanged'],
			['band_lo_hz', 'unchanged'],
			['band_hi_hz', 'unchanged'],
			['vswr_max', 'changed'],
			['gain_dbi', 'removed'],
			['gain_verified', 'added']
		]);
	});

	it('diffTables combines the parts and counts them', () => {
		const side = (rows: DiffRow[]): TableSide => ({ parameters: [], rows, claim: {} });
		const diff = diffTables(
			side([row('a'), row('b'), row('c')]),
			side([row('c'), row('a', { formula: 'x' }), row('d')])
		);
		// c keeps its order relative to a; a both moved and changed formula, so it counts in both.
		expect(diff.summary).toEqual({ added: 1, removed: 1, changed: 1, moved: 1, unchanged: 1 });
		expect(diff.rows.find((d) => d.key === 'a')?.changes).toEqual(['formula', 'moved']);
		expect(diff.parameters).toEqual([]);
		expect(diff.claims).toEqual([]);
	});
});

import { describe, expect, it } from 'vitest';
import { parseEvaluateRequest, toTableInput } from './evaluate-request';
import { computeTable } from './table';

const valid = () => ({
	frequency_hz: 2.45e9,
	parameters: [
		{ key: 'vf', value: 0.66 },
		{ key: 'h', value: '1.6 mm' }
	],
	rows: [
		{
			key: 'quarter',
			label: 'Quarter wave',
			formula: 'lambda / 4',
			kind: 'resonant',
			tolerance_mm: 0.2
		},
		{ key: 'sleeve', formula: 'lambda_in(f, vf) / 4', kind: 'resonant' },
		{ key: 'board', formula: 'h', kind: 'material', catalogue: 'pcb_thickness' },
		{ key: 'n', formula: '4', kind: 'count', valid_ratio: { of: 'lambda', min: 0, max: 1 } }
	],
	band_hz: [2.4e9, 2.5e9],
	units: 'mm'
});

function fieldOf(body: unknown): string | undefined {
	const r = parseEvaluateRequest(body);
	return r.ok ? undefined : r.error.field;
}

describe('parseEvaluateRequest', () => {
	it('accepts a valid body and feeds the engine', () => {
		const r = parseEvaluateRequest(valid());
		expect(r.ok).toBe(true);
		if (!r.ok) return;
		const { definition, options } = toTableInput(r.value);
		expect(options).toEqual({ frequencyHz: 2.45e9, bandHz: [2.4e9, 2.5e9], units: 'mm' });
		const result = computeTable(definition, options);
		// [calc] λ/4 at 2.45 GHz = 30.5911 mm (CHECKS.md).
		expect(result.rows[0].value_mm).toBeCloseTo(30.5911, 4);
		expect(result.rows[0].label).toBe('Quarter wave');
	});

	it('parameters may be left out', () => {
		const body: Record<string, unknown> = valid();
		delete body.parameters;
		body.rows = [{ key: 'q', formula: 'lambda / 4', kind: 'resonant' }];
		expect(parseEvaluateRequest(body).ok).toBe(true);
	});

	it.each([null, 'text', 42, [], undefined])('malformed body %s', (body) => {
		expect(fieldOf(body)).toBe('body');
	});

	it('unknown kind names the row', () => {
		const body = valid();
		body.rows[3].kind = 'magic';
		const r = parseEvaluateRequest(body);
		expect(r).toEqual({
			ok: false,
			error: {
				field: 'rows[3].kind',
				message: 'kind must be one of resonant, structural, material, count'
			}
		});
	});

	it('too many rows', () => {
		const body = valid();
		body.rows = Array.from({ length: 201 }, (_, i) => ({
			key: `r${i}`,
			formula: '1 mm',
			kind: 'structural'
		}));
		expect(fieldOf(body)).toBe('rows');
	});

	it('formula over 500 characters', () => {
		const body = valid();
		body.rows[0].formula = `lambda${' + 0 mm'.repeat(90)}`;
		expect(body.rows[0].formula.length).toBeGreaterThan(500);
		expect(fieldOf(body)).toBe('rows[0].formula');
	});

	it.each([0, -5, 2e12, Infinity, NaN, '2.4 GHz', null])('frequency %s', (f) => {
		expect(fieldOf({ ...valid(), frequency_hz: f })).toBe('frequency_hz');
	});

	it('keys: pattern, reserved names, duplicates', () => {
		const body = valid();
		body.rows[1].key = '9lives';
		expect(fieldOf(body)).toBe('rows[1].key');
		const reserved = valid();
		reserved.parameters[0].key = 'lambda';
		expect(fieldOf(reserved)).toBe('parameters[0].key');
		const fn = valid();
		fn.parameters[0].key = 'patch_width';
		expect(fieldOf(fn)).toBe('parameters[0].key');
		const unit = valid();
		unit.rows[0].key = 'mm';
		expect(fieldOf(unit)).toBe('rows[0].key');
		const long = valid();
		long.rows[0].key = 'a'.repeat(41);
		expect(fieldOf(long)).toBe('rows[0].key');
		const dup = valid();
		dup.rows[2].key = 'vf';
		const r = parseEvaluateRequest(dup);
		expect(r).toEqual({
			ok: false,
			error: { field: 'rows[2].key', message: 'duplicate key "vf"' }
		});
	});

	it('other fields', () => {
		expect(fieldOf({ ...valid(), band_hz: [2.5e9, 2.4e9] })).toBe('band_hz');
		expect(fieldOf({ ...valid(), band_hz: [2.4e9] })).toBe('band_hz');
		expect(fieldOf({ ...valid(), units: 'cm' })).toBe('units');
		const cat = valid();
		(cat.rows[2] as Record<string, unknown>).catalogue = 'rivets';
		expect(fieldOf(cat)).toBe('rows[2].catalogue');
		const value = valid();
		(value.parameters[0] as Record<string, unknown>).value = { evil: true };
		expect(fieldOf(value)).toBe('parameters[0].value');
		const ratio = valid();
		ratio.rows[3].valid_ratio = { of: 'lambda', min: 2, max: 1 };
		expect(fieldOf(ratio)).toBe('rows[3].valid_ratio.max');
		const tol = valid();
		tol.rows[0].tolerance_mm = -1;
		expect(fieldOf(tol)).toBe('rows[0].tolerance_mm');
	});

	it('a body with __proto__ keys changes nothing', () => {
		const body = JSON.parse(`{"frequency_hz": 1e9, "rows": [], "__proto__": {"polluted": true}}`);
		expect(parseEvaluateRequest(body).ok).toBe(true);
		expect(({} as Record<string, unknown>).polluted).toBeUndefined();
	});
});

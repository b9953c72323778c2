import { describe, expect, it } from 'vitest';
import { C } from '$lib/rf/units/constants';
import { evaluateBody } from './evaluate';
import { DomainError } from '../http/errors';

const body = (
	frequency_hz: unknown,
	formula = 'lambda / 4',
	extra: Record<string, unknown> = {}
) => ({
	frequency_hz,
	parameters: [{ key: 'vf', value: 0.66 }],
	rows: [
		{ key: 'quarter', formula, kind: 'resonant' },
		{ key: 'balun', formula: 'quarter * vf', kind: 'resonant' }
	],
	...extra
});

function refusal(run: () => unknown): { status: number; field?: string; message: string } {
	try {
		run();
	} catch (e) {
		expect(e).toBeInstanceOf(DomainError);
		const d = e as DomainError;
		return { status: d.status, field: d.field, message: d.message };
	}
	throw new Error('expected a refusal');
}

const value = (r: ReturnType<typeof evaluateBody>, key: string) =>
	r.rows.find((row) => row.key === key)!.value_mm!;

describe('evaluateBody (the evaluate API, with its compiled-table cache)', () => {
	it('gives the same answers for a known table as for a new one, at each frequency', () => {
		for (const f of [2.4e9, 5.8e9, 5.8e9, 433.92e6]) {
			const r = evaluateBody(body(f));
			// λ/4 = c/(4f), [calc] with c exact (SI Brochure, 9th ed.); balun = λ/4 · 0.66.
			expect(value(r, 'quarter')).toBeCloseTo((C / f / 4) * 1000, 9);
			expect(value(r, 'balun')).toBeCloseTo((C / f / 4) * 1000 * 0.66, 9);
			expect(r.frequency_hz).toBe(f);
		}
	});

	it('recompiles when the table changes, even by one formula', () => {
		const before = value(evaluateBody(body(2.45e9)), 'quarter');
		const after = value(evaluateBody(body(2.45e9, 'lambda / 2')), 'quarter');
		expect(after).toBeCloseTo(2 * before, 9);
	});

	it('names the bad field the same way whether or not the table is known', () => {
		const cold = refusal(() => evaluateBody(body(-5, 'lambda / 8')));
		evaluateBody(body(1e9, 'lambda / 8'));
		const warm = refusal(() => evaluateBody(body(-5, 'lambda / 8')));
		expect(cold).toEqual(warm);
		expect(warm).toMatchObject({ status: 400, field: 'frequency_hz' });
		expect(refusal(() => evaluateBody(body(1e9, 'lambda / 8', { units: 'cm' })))).toMatchObject({
			field: 'units'
		});
		expect(
			refusal(() => evaluateBody(body(1e9, 'lambda / 8', { band_hz: [2e9, 1e9] })))
		).toMatchObject({ field: 'band_hz' });
	});

	it('refuses a bad table with the row named, and bodies that are not objects', () => {
		const bad = { ...body(1e9), rows: [{ key: 'x', formula: '1 mm', kind: 'fixed' }] };
		expect(refusal(() => evaluateBody(bad))).toMatchObject({ status: 400, field: 'rows[0].kind' });
		expect(refusal(() => evaluateBody([1, 2]))).toMatchObject({ status: 400, field: 'body' });
		expect(refusal(() => evaluateBody(null))).toMatchObject({ status: 400, field: 'body' });
	});
});

/**
 * Every declared family function has a worked example whose expected value comes from its source;
 * the compiler's fast path and the mathjs reference both reproduce it, and both accept exactly the
 * declared arguments (so the lists cannot drift apart again).
 */
import { describe, expect, it } from 'vitest';
import { C } from '../units/constants';
import { DECLARATIONS, signature } from './declarations';
import { compileFormula } from './formula';
import { FREQUENCY, LENGTH, SPEED } from './dims';
import { FUNCTIONS } from './functions';
import { referenceEvaluate, referenceUnit } from './sandbox';
import type { ScopeEntry } from './types';

const SCALE = { mm: 1e-3, GHz: 1e9, '': 1 } as const;
const ENTRIES = new Map<string, ScopeEntry>([
	['f', { slot: 0, dims: FREQUENCY }],
	['lambda', { slot: 1, dims: LENGTH }],
	['c', { slot: 2, dims: SPEED }]
]);
const scope = { lookup: (n: string) => ENTRIES.get(n), refuse: () => undefined };

function fastPath(text: string, fHz: number): number {
	const r = compileFormula(text, scope);
	if (!r.ok) throw new Error(`${text}: ${r.error.message}`);
	return r.expr.run(Float64Array.from([fHz, C / fHz, C]));
}

function reference(text: string, fHz: number): number {
	const s = new Map<string, unknown>([
		['f', referenceUnit(fHz, 'Hz')],
		['lambda', referenceUnit(C / fHz, 'm')],
		['c', referenceUnit(C, 'm/s')]
	]);
	const out = referenceEvaluate(text, s) as number | { value: number };
	return typeof out === 'number' ? out : out.value;
}

describe('declared family functions', () => {
	it('are all in the compiler allow-list, with the declared number of arguments', () => {
		for (const d of DECLARATIONS) {
			const spec = FUNCTIONS.get(d.name);
			expect(spec, d.name).toBeDefined();
			expect([spec!.min, spec!.max], d.name).toEqual([
				d.args.filter((a) => a.default === undefined).length,
				d.args.length
			]);
		}
	});

	it.each(DECLARATIONS.map((d) => [signature(d), d] as const))(
		'%s: its example gives the source value on the fast path and in the reference',
		(_sig, d) => {
			const { formula, at_hz = 2.45e9, value, unit, tolerance, source } = d.example;
			expect(source.length, `${d.name} example needs a source`).toBeGreaterThan(10);
			const expected = value * SCALE[unit];
			const fast = fastPath(formula, at_hz);
			expect(
				Math.abs(fast - expected) / Math.abs(expected),
				`${formula} = ${fast}`
			).toBeLessThanOrEqual(tolerance);
			expect(reference(formula, at_hz)).toBeCloseTo(fast, 9);
		}
	);

	it.each(DECLARATIONS.map((d) => [signature(d), d] as const))(
		'%s: the reference takes every declared argument, optional ones included',
		(_sig, d) => {
			const sample = { frequency: '5 GHz', length: '30 mm', number: '2' } as const;
			const text = `${d.name}(${d.args.map((a) => sample[a.quantity]).join(', ')})`;
			const fast = fastPath(text, 2.45e9);
			expect(Number.isFinite(fast), text).toBe(true);
			expect(reference(text, 2.45e9)).toBeCloseTo(fast, 9);
		}
	);
});

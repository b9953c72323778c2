import Complex from 'complex.js';
import { describe, expect, it } from 'vitest';
import { seededRandom } from '../sweeps/synthetic';
import { complexMatrix, luFactor, luSolve } from './complex-lu';

/** A·x with complex.js (an independent complex arithmetic), A row-major interleaved. */
function multiply(a: Float64Array, n: number, x: Complex[]): Complex[] {
	return Array.from({ length: n }, (_, i) => {
		let s = new Complex(0, 0);
		for (let j = 0; j < n; j++)
			s = s.add(new Complex(a[2 * (i * n + j)], a[2 * (i * n + j) + 1]).mul(x[j]));
		return s;
	});
}

describe('complex LU with partial pivoting', () => {
	it('solves random systems: A x = b recovers x', () => {
		const rand = seededRandom(7);
		for (const n of [1, 2, 5, 40]) {
			const a = complexMatrix(n);
			for (let i = 0; i < a.length; i++) a[i] = rand() - 0.5;
			const x = Array.from({ length: n }, () => new Complex(rand() - 0.5, rand() - 0.5));
			const b = multiply(a, n, x);
			const f = luFactor(Float64Array.from(a), n);
			expect(f.ok).toBe(true);
			const got = luSolve(f, Float64Array.from(b.flatMap((c) => [c.re, c.im])));
			for (let i = 0; i < n; i++) {
				expect(got[2 * i]).toBeCloseTo(x[i].re, 9);
				expect(got[2 * i + 1]).toBeCloseTo(x[i].im, 9);
			}
		}
	});

	it('needs its pivoting: a zero in the corner', () => {
		// [[0, 1], [j, 1]] x = [1, 1 + j] has x = [1, 1]; without a row swap the first pivot is 0.
		const a = Float64Array.from([0, 0, 1, 0, 0, 1, 1, 0]);
		const f = luFactor(a, 2);
		expect(f.ok).toBe(true);
		expect(Array.from(f.piv)).toEqual([1, 0]);
		const x = luSolve(f, Float64Array.from([1, 0, 1, 1]));
		expect(Array.from(x).map((v) => +v.toFixed(12))).toEqual([1, 0, 1, 0]);
	});

	it('reports a singular matrix', () => {
		const a = Float64Array.from([1, 1, 2, 2, 2, 2, 4, 4]); // second row = 2 × first
		expect(luFactor(a, 2).ok).toBe(false);
	});
});

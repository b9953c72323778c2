import { describe, expect, it } from 'vitest';
import { seededRandom } from '../sweeps/synthetic';
import { aaa, evaluateFit, smallestRightSingularVector } from './rational';

/** r(x) = (x − 0.3 + 0.2j)/((x − 0.1)² + 0.04) + 2 − j, a type (2, 2) function with poles at 0.1 ± 0.2j. */
function target(x: number): [number, number] {
	const dr = (x - 0.1) ** 2 + 0.04;
	return [(x - 0.3) / dr + 2, 0.2 / dr - 1];
}

describe('AAA rational fit [AAA2018]', () => {
	it('recovers a rational function between its samples to 1e-9', () => {
		const xs = Array.from({ length: 21 }, (_, i) => -1 + i / 10);
		const F = xs.flatMap(target);
		const fit = aaa(xs, F, 1e-12);
		expect(fit.x.length).toBeLessThanOrEqual(6); // a (2, 2) function needs only a few support points
		const rand = seededRandom(3);
		const out = [0, 0];
		for (let k = 0; k < 50; k++) {
			const x = -1 + 2 * rand();
			evaluateFit(fit, x, out);
			const [re, im] = target(x);
			expect(Math.hypot(out[0] - re, out[1] - im)).toBeLessThan(1e-9);
		}
	});

	it('interpolates exactly at its support points', () => {
		const xs = [0, 0.25, 0.5, 0.75, 1, 1.25];
		const fit = aaa(
			xs,
			xs.flatMap((x) => [Math.cos(x), Math.sin(x)]),
			0
		);
		const out = [0, 0];
		for (let j = 0; j < fit.x.length; j++) {
			evaluateFit(fit, fit.x[j], out);
			expect(out).toEqual([fit.f[2 * j], fit.f[2 * j + 1]]);
		}
	});
});

describe('smallest right singular vector (one-sided Jacobi)', () => {
	it('finds the null vector of a rank-one complex matrix', () => {
		// columns c and (1 + j)·c: the null space is spanned by (1 + j, −1)/√3
		const rows = [
			[1, 0.5],
			[2, -1],
			[0.3, 0.7]
		];
		const a = new Float64Array(2 * 3 * 2);
		rows.forEach(([re, im], r) => {
			a[2 * r] = re;
			a[2 * r + 1] = im;
			a[6 + 2 * r] = re - im; // (1 + j)(re + j·im)
			a[6 + 2 * r + 1] = re + im;
		});
		const copy = Float64Array.from(a);
		const v = smallestRightSingularVector(a, 3, 2);
		expect(Math.hypot(...v)).toBeCloseTo(1, 12);
		for (let r = 0; r < 3; r++) {
			const re =
				copy[2 * r] * v[0] -
				copy[2 * r + 1] * v[1] +
				copy[6 + 2 * r] * v[2] -
				copy[6 + 2 * r + 1] * v[3];
			const im =
				copy[2 * r] * v[1] +
				copy[2 * r + 1] * v[0] +
				copy[6 + 2 * r] * v[3] +
				copy[6 + 2 * r + 1] * v[2];
			expect(Math.hypot(re, im)).toBeLessThan(1e-12);
		}
	});
});

import { describe, expect, it } from 'vitest';
import { gaussLegendre, gradedRule } from './quadrature';

const apply = (r: { t: Float64Array; w: Float64Array }, f: (t: number) => number) =>
	r.t.reduce((s, t, i) => s + r.w[i] * f(t), 0);

describe('Gauss–Legendre on [0, 1]', () => {
	it('integrates tⁿ exactly up to degree 2n − 1 (Abramowitz & Stegun §25.4) [AS1964]', () => {
		for (const n of [1, 2, 3, 5, 8, 12]) {
			for (let d = 0; d <= 2 * n - 1; d++)
				expect(apply(gaussLegendre(n), (t) => t ** d)).toBeCloseTo(1 / (d + 1), 13);
		}
		// degree 2n misses by the error term (n!)⁴/((2n+1)((2n)!)³)·f⁽²ⁿ⁾ on [0, 1] (A&S §25.4, Gauss’s formula; equation number not checked), f⁽²ⁿ⁾ = (2n)!
		const fact = (k: number): number => (k <= 1 ? 1 : k * fact(k - 1));
		for (const n of [1, 2, 3, 5, 8]) {
			const miss = 1 / (2 * n + 1) - apply(gaussLegendre(n), (t) => t ** (2 * n));
			const term = fact(n) ** 4 / ((2 * n + 1) * fact(2 * n) ** 2);
			expect(miss / term).toBeCloseTo(1, 3);
		}
	});

	it('the 2-point nodes are (1 ∓ 1/√3)/2 with weights ½ [AS1964]', () => {
		const r = gaussLegendre(2);
		expect([...r.t].sort()).toEqual(
			[(1 - 1 / Math.sqrt(3)) / 2, (1 + 1 / Math.sqrt(3)) / 2].map((v) => expect.closeTo(v, 14))
		);
		expect([...r.w]).toEqual([expect.closeTo(0.5, 14), expect.closeTo(0.5, 14)]);
	});
});

describe('graded rule', () => {
	it('integrates a logarithmic end singularity: ∫₀¹ ln t dt = −1 [calc]', () => {
		expect(Math.abs(apply(gradedRule(1e-8), Math.log) + 1)).toBeLessThan(1e-6);
		// plain Gauss with as many points is much worse
		expect(Math.abs(apply(gaussLegendre(gradedRule(1e-8).t.length), Math.log) + 1)).toBeGreaterThan(
			1e-5
		);
	});

	it('integrates ln(t² + ε²), peaked at 0, to the closed form [calc: ln(1+ε²) − 2 + 2ε·atan(1/ε)]', () => {
		const e = 1e-4;
		const exact = Math.log(1 + e * e) - 2 + 2 * e * Math.atan(1 / e);
		expect(Math.abs(apply(gradedRule(e / 4), (t) => Math.log(t * t + e * e)) - exact)).toBeLessThan(
			1e-6
		);
	});
});

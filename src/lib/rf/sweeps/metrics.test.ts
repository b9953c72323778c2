import Complex from 'complex.js';
import { describe, expect, it } from 'vitest';
import { rlcEdges, rlcSweep } from '../../testing/sweeps/rlc';
import type { Sweep } from './types';
import {
	findMinimumVswr,
	fractionalBandwidth,
	impedanceFromGamma,
	interpolateVswr,
	magnitudeFromVswr,
	mismatchLossDb,
	pointMetrics,
	renormalizeSweep,
	returnLossDb,
	vswrBands,
	vswrFromMagnitude,
	vswrSeries
} from './metrics';

describe('reflection relations', () => {
	// CHECKS.md table, Pozar, Microwave Engineering, 4th ed., §2.3 relations [calc for the table]:
	// VSWR | |Γ| | RL dB | ML dB | reflected power
	const table = [
		[1.5, 0.2, 13.979, 0.1773, 0.04],
		[2.0, 0.3333, 9.542, 0.5115, 0.111],
		[3.0, 0.5, 6.021, 1.2494, 0.25]
	];
	for (const [vswr, g, rl, ml, p] of table) {
		it(`VSWR ${vswr}: |Γ| ${g}, RL ${rl} dB, ML ${ml} dB, ${p * 100} % reflected`, () => {
			const m = magnitudeFromVswr(vswr);
			expect(m).toBeCloseTo(g, 4);
			expect(returnLossDb(m)).toBeCloseTo(rl, 3);
			expect(mismatchLossDb(m)).toBeCloseTo(ml, 4);
			expect(m * m).toBeCloseTo(p, 3);
			expect(vswrFromMagnitude(m)).toBeCloseTo(vswr, 12);
		});
	}

	it('limits: a match has VSWR 1 and infinite RL; total reflection infinite VSWR', () => {
		expect(vswrFromMagnitude(0)).toBe(1);
		expect(returnLossDb(0)).toBe(Infinity);
		expect(vswrFromMagnitude(1)).toBe(Infinity);
		expect(mismatchLossDb(1)).toBe(Infinity);
		expect(magnitudeFromVswr(Infinity)).toBe(1);
	});

	it('Z = Z0 (1+Γ)/(1−Γ): Γ = 0.2 + j0.4 at 50 Ω is 50 + j50 Ω', () => {
		// [calc] Γ = (ZL−Z0)/(ZL+Z0) = j50/(100+j50) = 0.2 + j0.4 (Pozar 4th ed. §2.3)
		const z = impedanceFromGamma(0.2, 0.4, 50);
		expect(z.re).toBeCloseTo(50, 10);
		expect(z.im).toBeCloseTo(50, 10);
		expect(impedanceFromGamma(1, 0, 50).re).toBe(Infinity);
		// against complex.js for an arbitrary point
		const g = new Complex(-0.3, 0.55);
		const ref = g.add(1).div(new Complex(1, 0).sub(g)).mul(75);
		const mine = impedanceFromGamma(-0.3, 0.55, 75);
		expect(mine.re).toBeCloseTo(ref.re, 10);
		expect(mine.im).toBeCloseTo(ref.im, 10);
	});

	it('pointMetrics gives every per-point quantity', () => {
		const s: Sweep = {
			source: 'csv',
			z0: 50,
			f_hz: new Float64Array([1, 2]),
			re: new Float64Array([0.2, 0]),
			im: new Float64Array([0, 0.5]),
			comments: [],
			phase_known: true
		};
		const m = pointMetrics(s);
		expect(m.vswr[0]).toBeCloseTo(1.5, 12); // table above
		expect(m.rl_db[1]).toBeCloseTo(6.021, 3);
		expect(m.ml_db[1]).toBeCloseTo(1.2494, 4);
		expect(m.z_re[0]).toBeCloseTo(75, 10); // [calc] 50·1.2/0.8
		// [calc] Γ = j0.5: Z = 50(1+j0.5)/(1−j0.5) = 50(0.6 + j0.8) = 30 + j40
		expect(m.z_re[1]).toBeCloseTo(30, 10);
		expect(m.z_im[1]).toBeCloseTo(40, 10);
	});

	it('renormalizeSweep agrees with Γ = (Z − Z0)/(Z + Z0) at the new Z0 (complex.js)', () => {
		const z = new Complex(30, -45);
		const g50 = z.sub(50).div(z.add(50));
		const s: Sweep = {
			source: 'touchstone',
			z0: 50,
			f_hz: new Float64Array([1]),
			re: new Float64Array([g50.re]),
			im: new Float64Array([g50.im]),
			comments: [],
			phase_known: true
		};
		const g75 = z.sub(75).div(z.add(75));
		const r = renormalizeSweep(s, 75);
		expect(r.re[0]).toBeCloseTo(g75.re, 12);
		expect(r.im[0]).toBeCloseTo(g75.im, 12);
		expect(r.z0).toBe(75);
	});
});

describe('bands of an analytic series-RLC resonator (R = Z0 = 50 Ω)', () => {
	// [calc] Z = R + jX, X = ωL − 1/(ωC). With R = Z0: |Γ|² = X²/(4R² + X²).
	// |Γ| = 1/3 (VSWR 2) ⇔ 9X² = 4R² + X² ⇔ |X| = R/√2; |Γ| = 0.2 (VSWR 1.5) ⇔ 24X² = 4R² ⇔ |X| = R/√6.
	// ωL − 1/(ωC) = ±Xe ⇔ Lω² ∓ Xe ω − 1/C = 0 ⇔ ω = (±Xe + √(Xe² + 4L/C)) / (2L).
	const f0 = 100e6;
	const q = 10;
	const r = 50;
	const edges = (vswr: number) => rlcEdges(f0, q, r, vswr);
	const sweep = rlcSweep(f0, q, r, 50, 80e6, 120e6, 20001);
	const v = vswrSeries(sweep);

	it('VSWR ≤ 2 edges match the closed form', () => {
		const [lo, hi] = edges(2);
		const bands = vswrBands(sweep.f_hz, v, 2);
		expect(bands.length).toBe(1);
		// grid step 2 kHz; linear interpolation of the smooth VSWR curve is good to well under 1 Hz
		expect(Math.abs(bands[0].lo_hz - lo)).toBeLessThan(5);
		expect(Math.abs(bands[0].hi_hz - hi)).toBeLessThan(5);
		expect(bands[0].lo_at_sweep_start || bands[0].hi_at_sweep_stop).toBe(false);
	});

	it('VSWR ≤ 1.5 edges match the closed form', () => {
		const [lo, hi] = edges(1.5);
		const [band] = vswrBands(sweep.f_hz, v, 1.5);
		expect(Math.abs(band.lo_hz - lo)).toBeLessThan(5);
		expect(Math.abs(band.hi_hz - hi)).toBeLessThan(5);
	});

	it('fractional bandwidth = (hi − lo)/centre of the closed-form edges', () => {
		const [lo, hi] = edges(2);
		const min = findMinimumVswr(sweep.f_hz, v);
		const fbw = fractionalBandwidth(vswrBands(sweep.f_hz, v, 2), sweep.f_hz[min.index]);
		expect(fbw).toBeCloseTo((hi - lo) / ((hi + lo) / 2), 6);
	});

	it('a band touching the sweep end reports the sweep end and a flag', () => {
		const [lo] = edges(2);
		const part = rlcSweep(f0, q, r, 50, 99e6, 130e6, 3001);
		const [band] = vswrBands(part.f_hz, vswrSeries(part), 2);
		expect(band.lo_hz).toBe(99e6);
		expect(band.lo_at_sweep_start).toBe(true);
		expect(band.hi_at_sweep_stop).toBe(false);
		expect(lo).toBeLessThan(99e6); // the true edge lies outside the sweep
	});
});

describe('minimum VSWR', () => {
	it('parabolic interpolation finds a minimum between grid points (R = 75 Ω, Z0 = 50 Ω)', () => {
		// [calc] at resonance Z = R = 75 Ω: Γ = 25/125 = 0.2, VSWR = 1.5 (Pozar 4th ed. §2.3)
		const f0 = 435e6;
		const s = rlcSweep(f0, 20, 75, 50, 400e6, 470.3e6, 301); // 234.33 kHz grid, f0 off-grid
		const min = findMinimumVswr(s.f_hz, vswrSeries(s));
		expect(min.min_interpolated).toBe(true);
		const step = s.f_hz[1] - s.f_hz[0];
		expect(Math.abs(s.f_hz[min.index] - f0)).toBeGreaterThan(step / 10);
		expect(Math.abs(min.f_hz - f0)).toBeLessThan(Math.abs(s.f_hz[min.index] - f0) / 10);
		expect(min.vswr).toBeCloseTo(1.5, 4);
	});

	it('a minimum at the sweep end is the sample itself, not interpolated', () => {
		const min = findMinimumVswr([1, 2, 3], [3, 2, 1.2]);
		expect(min).toEqual({ f_hz: 3, vswr: 1.2, index: 2, min_interpolated: false });
	});

	it('a symmetric dip interpolates to its centre', () => {
		// [calc] parabola through (1, 2), (2, 1.5), (3, 2): vertex at 2, value 1.5
		const min = findMinimumVswr([1, 2, 3], [2, 1.5, 2]);
		expect(min.f_hz).toBeCloseTo(2, 12);
		expect(min.vswr).toBeCloseTo(1.5, 12);
	});
});

describe('piecewise-linear VSWR curve', () => {
	// hand-made curve: VSWR 3, 1.5, 3, 1.2, 3 at f = 1..5
	const f = [1, 2, 3, 4, 5];
	const v = [3, 1.5, 3, 1.2, 3];

	it('finds every band with interpolated edges', () => {
		// [calc] edge between (1, 3) and (2, 1.5) at VSWR 2: f = 1 + (2 − 3)/(1.5 − 3) = 1.6667;
		// between (2, 1.5) and (3, 3): f = 2 + (2 − 1.5)/(3 − 1.5) = 2.3333;
		// between (3, 3) and (4, 1.2): f = 3 + (2 − 3)/(1.2 − 3) = 3.5556; (4, 1.2)–(5, 3): 4.4444
		const bands = vswrBands(f, v, 2);
		expect(bands.map((b) => [b.lo_hz, b.hi_hz]).flat()).toEqual([
			expect.closeTo(1.6667, 4),
			expect.closeTo(2.3333, 4),
			expect.closeTo(3.5556, 4),
			expect.closeTo(4.4444, 4)
		]);
	});

	it('interpolates inside the sweep and returns null outside', () => {
		expect(interpolateVswr(f, v, 1.5)).toBeCloseTo(2.25, 12); // [calc] (3 + 1.5)/2
		expect(interpolateVswr(f, v, 4)).toBe(1.2);
		expect(interpolateVswr(f, v, 0.5)).toBeNull();
		expect(interpolateVswr(f, v, 5.01)).toBeNull();
	});

	it('an infinite VSWR point bounds a band at its finite neighbour', () => {
		const bands = vswrBands([1, 2, 3], [Infinity, 1.2, 1.4], 2);
		expect(bands[0]).toEqual({
			lo_hz: 2,
			hi_hz: 3,
			lo_at_sweep_start: false,
			hi_at_sweep_stop: true
		});
		expect(interpolateVswr([1, 2, 3], [Infinity, 1.2, 1.4], 1.5)).toBe(Infinity);
	});
});

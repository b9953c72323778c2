import { describe, expect, it } from 'vitest';
import { MAX_DIRECT_SOLVES } from './limits';
import { C0, centreFedDipole, resonanceByBisection } from '$lib/testing/wire-models';
import { solve } from './solver';
import { predictSweep, reflection, summarizeImpedance, vswrOf } from './sweep';

describe('reflection and VSWR (Pozar, Microwave Engineering 4th ed., §2.3) [Pozar4]', () => {
	it('Z = 100 Ω on 50 Ω: Γ = 1/3, VSWR 2; a match gives VSWR 1', () => {
		expect(reflection({ re: 100, im: 0 }, 50)).toEqual({ re: expect.closeTo(1 / 3, 15), im: 0 });
		expect(vswrOf({ re: 100, im: 0 }, 50)).toBeCloseTo(2, 14);
		expect(vswrOf({ re: 25, im: 0 }, 50)).toBeCloseTo(2, 14);
		expect(vswrOf({ re: 50, im: 0 }, 50)).toBe(1);
		// Γ = (Z − Z0)/(Z + Z0) for Z = 50 + j50: j50/(100 + j50) = (0.2, 0.4) [calc]
		const g = reflection({ re: 50, im: 50 }, 50);
		expect([g.re, g.im]).toEqual([expect.closeTo(0.2, 15), expect.closeTo(0.4, 15)]);
	});
});

describe('resonance and VSWR ≤ 2 band from impedance samples', () => {
	// Series RLC: R = Z0 = 50 Ω, f0 = 1/(2π√(LC)); VSWR = 2 where |Γ| = 1/3, i.e. X = ±R/√2, so
	// ω = (±R/√2 + √(R²/2 + 4L/C)) / (2L) [calc].
	const R = 50;
	const L = 1e-6; // Q = ω0·L/R ≈ 12.6: the VSWR ≤ 2 band is about ±2.8 % wide
	const C = 1 / ((2 * Math.PI * 100e6) ** 2 * L);
	const z = (f: number) => ({ re: R, im: 2 * Math.PI * f * L - 1 / (2 * Math.PI * f * C) });
	const edge = (s: number) =>
		(s * (R / Math.SQRT2) + Math.sqrt((R * R) / 2 + (4 * L) / C)) / (2 * L) / (2 * Math.PI);
	const f = Array.from({ length: 41 }, (_, i) => 80e6 + i * 1e6);

	it('with the impedance between samples: exact resonance and edges', () => {
		const s = summarizeImpedance(f, f.map(z), 50, z);
		expect(s.resonance_hz! / 100e6).toBeCloseTo(1, 9);
		expect(s.vswr2_band!.lo_hz / edge(-1)).toBeCloseTo(1, 9);
		expect(s.vswr2_band!.hi_hz / edge(1)).toBeCloseTo(1, 9);
		expect(s.min_vswr.vswr).toBeCloseTo(1, 3);
		expect(s.points[20]).toMatchObject({
			frequency_hz: 100e6,
			z_re: 50,
			vswr: expect.closeTo(1, 9)
		});
	});

	it('from the samples alone: linear interpolation, within a step', () => {
		const s = summarizeImpedance(f, f.map(z), 50);
		expect(Math.abs(s.resonance_hz! - 100e6)).toBeLessThan(1e6);
		expect(Math.abs(s.vswr2_band!.lo_hz - edge(-1))).toBeLessThan(1e6);
	});

	it('no resonance, no band: null', () => {
		const s = summarizeImpedance(
			f,
			f.map((x) => ({ re: 500, im: x / 1e6 })),
			50
		);
		expect(s.resonance_hz).toBeNull();
		expect(s.vswr2_band).toBeNull();
	});
});

describe('predicted sweep: a rational fit checked against direct solves', () => {
	const f0 = 868e6;
	const lambda = C0 / f0;
	const g = { value: centreFedDipole(0.48 * lambda, 5e-4, 40) };

	it('matches direct solves between its points, with fewer solves than points', () => {
		const s = predictSweep(g.value, {
			lo_hz: 0.7 * f0,
			hi_hz: 1.3 * f0,
			points: 101,
			reference_ohms: 50
		});
		expect(s.points).toHaveLength(101);
		expect(s.fit!.within_tolerance).toBe(true);
		expect(s.fit!.direct_solves).toBeLessThan(40);
		// the test's own spot checks at output points the sweep did not solve at (samples sit every 12.5 points)
		for (const i of [3, 31, 47, 58, 96]) {
			const p = s.points[i];
			const zd = solve(g.value, p.frequency_hz).z_in;
			expect(Math.hypot(p.z_re - zd.re, p.z_im - zd.im)).toBeLessThan(0.05);
		}
		// the resonance agrees with a bisection on direct solves
		const lo = resonanceByBisection(g.value, 0.9 * f0, 1.05 * f0);
		expect(Math.abs(s.resonance_hz! - lo) / lo).toBeLessThan(1e-5);
		expect(s.vswr2_band!.lo_hz).toBeLessThan(s.resonance_hz!);
		expect(s.vswr2_band!.hi_hz).toBeGreaterThan(s.resonance_hz!);
	});

	it('says so when the fit cannot meet its tolerance within the solve budget', () => {
		const coarse = { value: centreFedDipole(0.48 * lambda, 5e-4, 8) };
		const s = predictSweep(coarse.value, {
			lo_hz: 0.7 * f0,
			hi_hz: 1.3 * f0,
			points: 401,
			reference_ohms: 50,
			tolerance: 0
		});
		expect(s.fit!.within_tolerance).toBe(false);
		expect(s.fit!.direct_solves).toBeLessThanOrEqual(MAX_DIRECT_SOLVES);
		expect(s.points).toHaveLength(401);
	});

	it('short sweeps are solved point by point (no fit)', () => {
		const s = predictSweep(g.value, {
			lo_hz: 0.9 * f0,
			hi_hz: 1.1 * f0,
			points: 5,
			reference_ohms: 50
		});
		expect(s.fit).toBeNull();
		expect(s.points[2].z_re).toBeCloseTo(solve(g.value, f0).z_in.re, 9);
	});
});

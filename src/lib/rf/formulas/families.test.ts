import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import { C } from '../units/constants';
import {
	P01,
	P11_PRIME,
	gammaFromVswr,
	guideWavelength,
	lambdaIn,
	mismatchLoss,
	patchDeltaL,
	patchEeff,
	patchLength,
	patchWidth,
	rlFromVswr,
	te11Cutoff,
	tm01Cutoff,
	vfFromEr,
	vswrFromRl
} from './families';

// bessel ships no type declarations; its API is besselj(x, order).
const bessel = createRequire(import.meta.url)('bessel') as {
	besselj(x: number, n: number): number;
};

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('constants', () => {
	it('c is exact', () => {
		// SI Brochure 9th ed. (BIPM 2019), definition of the metre: c = 299 792 458 m/s exactly.
		expect(C).toBe(299792458);
	});

	it('quarter wavelengths', () => {
		// [calc] λ/4 = c/(4f): 2.4 GHz 31.2284 mm, 2.45 GHz 30.5911 mm, 5.8 GHz 12.9221 mm (CHECKS.md).
		expect((C / 2.4e9 / 4) * 1000).toBeCloseTo(31.2284, 4);
		expect((C / 2.45e9 / 4) * 1000).toBeCloseTo(30.5911, 4);
		expect((C / 5.8e9 / 4) * 1000).toBeCloseTo(12.9221, 4);
	});
});

describe('microstrip patch, Balanis 3rd ed. §14.2, Example 14.1', () => {
	// Example 14.1: εr = 2.2, h = 0.1588 cm, fr = 10 GHz; the book uses c = 3e8 m/s.
	const [er, h, fr, c0] = [2.2, 0.1588e-2, 10e9, 3e8];

	it('reproduces the book figures with c = 3e8', () => {
		const w = patchWidth(fr, er, c0);
		// [calc] with c = 3e8: W = 1.18585 cm, εreff = 1.97161, ΔL = 0.081107 cm, L = 0.90606 cm.
		expect(w * 100).toBeCloseTo(1.18585, 5);
		const eeff = patchEeff(er, h, w);
		expect(eeff).toBeCloseTo(1.97161, 5);
		expect(patchDeltaL(h, w, eeff) * 100).toBeCloseTo(0.081107, 6);
		expect(patchLength(fr, er, h, c0) * 100).toBeCloseTo(0.90606, 5);
		// Balanis Example 14.1 printed values (3 decimals): W 1.186 cm, εreff 1.972, ΔL 0.081 cm, L 0.906 cm.
		expect(w * 100).toBeCloseTo(1.186, 3);
		expect(eeff).toBeCloseTo(1.972, 3);
		expect(patchLength(fr, er, h, c0) * 100).toBeCloseTo(0.906, 3);
	});

	it('with exact c stays within 0.1 % of the book', () => {
		// [calc] exact c: W = 1.18503 cm, L = 0.90534 cm; Balanis Example 14.1 W 1.186, L 0.906 cm.
		expect(patchWidth(fr, er) * 100).toBeCloseTo(1.18503, 5);
		expect(patchLength(fr, er, h) * 100).toBeCloseTo(0.90534, 5);
		expect(rel(patchWidth(fr, er) * 100, 1.186)).toBeLessThan(1e-3);
		expect(rel(patchLength(fr, er, h) * 100, 0.906)).toBeLessThan(1e-3);
	});
});

describe('circular waveguide, Pozar 4th ed. §3.4', () => {
	it('Bessel roots are zeros of J1′ and J0 (independent check with the bessel package)', () => {
		// J1'(x) = (J0(x) − J2(x)) / 2 (Abramowitz & Stegun 9.1.27).
		const j1p = (x: number) => (bessel.besselj(x, 0) - bessel.besselj(x, 2)) / 2;
		expect(Math.abs(j1p(P11_PRIME))).toBeLessThan(1e-6);
		expect(Math.sign(j1p(P11_PRIME - 1e-3))).not.toBe(Math.sign(j1p(P11_PRIME + 1e-3)));
		expect(Math.abs(bessel.besselj(P01, 0))).toBeLessThan(1e-6);
		expect(Math.sign(bessel.besselj(P01 - 1e-3, 0))).not.toBe(
			Math.sign(bessel.besselj(P01 + 1e-3, 0))
		);
	});

	it('air, a = 0.5 cm (d = 1 cm): TE11 17.570 GHz, TM01 22.949 GHz', () => {
		// [calc] fc = p c / (2π a), Pozar §3.4 (CHECKS.md).
		expect(te11Cutoff(0.01) / 1e9).toBeCloseTo(17.57, 2);
		expect(tm01Cutoff(0.01) / 1e9).toBeCloseTo(22.949, 2);
	});

	it('PTFE εr = 2.08, a = 0.5 cm: TE11 12.18 GHz, TM01 15.91 GHz, λg at 14 GHz 30.13 mm', () => {
		// [calc] CHECKS.md, Pozar §3.4 relations with λ = c/(f √εr).
		expect(te11Cutoff(0.01, 2.08) / 1e9).toBeCloseTo(12.18, 2);
		expect(tm01Cutoff(0.01, 2.08) / 1e9).toBeCloseTo(15.91, 2);
		expect(guideWavelength(14e9, 0.01, 2.08) * 1000).toBeCloseTo(30.13, 2);
	});

	it('no guide wavelength at or below cutoff', () => {
		// The TE11 mode does not propagate below fc (Pozar §3.4): 10 GHz < 17.57 GHz for d = 1 cm.
		expect(guideWavelength(10e9, 0.01)).toBeNaN();
		expect(te11Cutoff(0)).toBeNaN();
	});
});

describe('reflection table, Pozar 4th ed. §2.3', () => {
	// [calc] Γ = (V−1)/(V+1); RL = −20 log|Γ|; ML = −10 log(1−|Γ|²) (CHECKS.md table).
	const table: [number, number, number, number][] = [
		[1.5, 0.2, 13.979, 0.1773],
		[2.0, 1 / 3, 9.542, 0.5115],
		[3.0, 0.5, 6.021, 1.2494]
	];
	it.each(table)('VSWR %f', (v, g, rl, ml) => {
		expect(gammaFromVswr(v)).toBeCloseTo(g, 4);
		expect(rlFromVswr(v)).toBeCloseTo(rl, 3);
		expect(mismatchLoss(v)).toBeCloseTo(ml, 4);
		expect(vswrFromRl(rl)).toBeCloseTo(v, 3);
	});

	it('rejects impossible inputs', () => {
		// VSWR ≥ 1 and return loss ≥ 0 dB by definition (Pozar §2.3).
		expect(gammaFromVswr(0.5)).toBeNaN();
		expect(vswrFromRl(-1)).toBeNaN();
	});
});

describe('lines', () => {
	it('velocity factor 1/√εr', () => {
		// [calc] CHECKS.md: solid PE εr 2.25 → 0.667; PTFE 2.1 → 0.690 (Pozar ch. 2, from memory).
		expect(vfFromEr(2.25)).toBeCloseTo(0.667, 3);
		expect(vfFromEr(2.1)).toBeCloseTo(0.69, 3);
	});

	it('wavelength on a line: vf · c / f', () => {
		// [calc] 0.66 × λ(2.45 GHz) = 0.66 × 122.3643 mm = 80.7604 mm.
		expect(lambdaIn(2.45e9, 0.66) * 1000).toBeCloseTo(80.7604, 3);
	});
});

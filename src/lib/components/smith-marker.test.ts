import { describe, expect, it } from 'vitest';
import { formatImpedance, gammaAt, impedanceFromGamma, vswrFromGamma } from './smith-marker';

describe('impedanceFromGamma', () => {
	it('inverts Γ = (Z − Z0)/(Z + Z0)', () => {
		// [calc] formula Γ = (Z − 50)/(Z + 50): Z = 100 Ω → Γ = 1/3; Z = 50 + j50 → Γ = (j50)/(100 + j50) = 0.2 + 0.4j
		const a = impedanceFromGamma(1 / 3, 0);
		expect(a?.r).toBeCloseTo(100, 9);
		expect(a?.x).toBeCloseTo(0, 9);
		const b = impedanceFromGamma(0.2, 0.4);
		expect(b?.r).toBeCloseTo(50, 9);
		expect(b?.x).toBeCloseTo(50, 9);
	});

	it('uses the reference impedance and reports an open circuit', () => {
		// [calc] Γ = 0 is Z = Z0 for any Z0
		expect(impedanceFromGamma(0, 0, 75)?.r).toBeCloseTo(75, 9);
		expect(impedanceFromGamma(1, 0)).toBeNull();
	});

	it('formats r + jx with a true minus sign', () => {
		expect(formatImpedance({ r: 48.73, x: -3.21 })).toBe('48.7 \u2212 j3.2 Ω');
		expect(formatImpedance({ r: 250.4, x: 120.6 })).toBe('250 + j121 Ω');
		expect(formatImpedance({ r: 50, x: -0.01 })).toBe('50.0 + j0.0 Ω');
		expect(formatImpedance(null)).toBe('open (Z → ∞)');
	});

	it('gives VSWR from |Γ|', () => {
		// [calc] formula VSWR = (1 + |Γ|)/(1 − |Γ|): |Γ| = 1/3 → 2
		expect(vswrFromGamma(0, 1 / 3)).toBeCloseTo(2, 9);
		expect(vswrFromGamma(1, 0)).toBe(Infinity);
	});
});

describe('gammaAt', () => {
	const f = [100, 200, 300];
	const re = [0, 0.2, 0.4];
	const im = [0.1, -0.1, 0];

	it('interpolates linearly between samples', () => {
		// [calc] 250 is half-way between 200 and 300: re = 0.3, im = −0.05
		const g = gammaAt(f, re, im, 250);
		expect(g?.re).toBeCloseTo(0.3, 12);
		expect(g?.im).toBeCloseTo(-0.05, 12);
		expect(g?.interpolated).toBe(true);
	});

	it('takes a sample exactly, and the nearer end outside the sweep', () => {
		expect(gammaAt(f, re, im, 200)).toEqual({ re: 0.2, im: -0.1, f_hz: 200, interpolated: false });
		expect(gammaAt(f, re, im, 50)).toEqual({ re: 0, im: 0.1, f_hz: 100, interpolated: false });
		expect(gammaAt(f, re, im, 900)?.f_hz).toBe(300);
		expect(gammaAt([], [], [], 1)).toBeNull();
	});
});

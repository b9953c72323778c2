import Complex from 'complex.js';
import { describe, expect, it } from 'vitest';
import { parseTouchstone } from './touchstone';
import { syntheticResonatorSweep, toTouchstone } from './synthetic';

const base = { f0_hz: 435e6, q: 20, f_start_hz: 420e6, f_stop_hz: 450e6, points: 301 };

describe('syntheticResonatorSweep', () => {
	it('matches Γ = (Z − Z0)/(Z + Z0) for Z = R + jωL + 1/(jωC) (complex.js, independent)', () => {
		const s = syntheticResonatorSweep({ ...base, r_ohm: 30, z0: 50 });
		const w0 = 2 * Math.PI * base.f0_hz;
		const l = (base.q * 30) / w0; // Q = ω0 L / R
		const c = 1 / (w0 * w0 * l);
		for (const i of [0, 77, 150, 300]) {
			const w = 2 * Math.PI * s.f_hz[i];
			const z = new Complex(30, w * l).add(new Complex(0, w * c).inverse());
			const g = z.sub(50).div(z.add(50));
			expect(s.re[i]).toBeCloseTo(g.re, 12);
			expect(s.im[i]).toBeCloseTo(g.im, 12);
		}
	});

	it('at resonance Z = R: Γ = 0 for R = Z0 and 0.2 for R = 75 Ω, Z0 = 50 Ω', () => {
		// [calc] Γ = (75 − 50)/(75 + 50) = 0.2 (Pozar 4th ed. §2.3); f0 is grid point 150
		expect(
			Math.hypot(syntheticResonatorSweep(base).re[150], syntheticResonatorSweep(base).im[150])
		).toBeLessThan(1e-12);
		const s = syntheticResonatorSweep({ ...base, r_ohm: 75 });
		expect(s.re[150]).toBeCloseTo(0.2, 12);
		expect(s.im[150]).toBeCloseTo(0, 12);
	});

	it('is deterministic for a seed, differs across seeds, stays passive, and says it is demo data', () => {
		const a = syntheticResonatorSweep({ ...base, noise: 0.05, seed: 9 });
		const b = syntheticResonatorSweep({ ...base, noise: 0.05, seed: 9 });
		const c = syntheticResonatorSweep({ ...base, noise: 0.05, seed: 10 });
		expect(Array.from(a.re)).toEqual(Array.from(b.re));
		expect(Array.from(a.re)).not.toEqual(Array.from(c.re));
		for (let i = 0; i < a.re.length; i++)
			expect(Math.hypot(a.re[i], a.im[i])).toBeLessThanOrEqual(1 + 1e-12);
		expect(a.comments.join(' ')).toMatch(/synthetic demo data/);
	});

	it('refuses impossible options with RangeError', () => {
		expect(() => syntheticResonatorSweep({ ...base, points: 1 })).toThrow(RangeError);
		expect(() => syntheticResonatorSweep({ ...base, q: 0 })).toThrow(RangeError);
		expect(() => syntheticResonatorSweep({ ...base, f_stop_hz: 400e6 })).toThrow(RangeError);
	});
});

describe('toTouchstone', () => {
	const s = syntheticResonatorSweep({ ...base, r_ohm: 40, noise: 0.01, seed: 5 });

	for (const format of ['DB', 'MA', 'RI'] as const) {
		it(`writes Touchstone v1 (${format}) that reads back to the same sweep`, () => {
			const text = toTouchstone(s, {
				unit: 'MHz',
				format,
				comments: ['synthetic demo data', 'two\nlines']
			});
			const lines = text.split('\n');
			expect(lines[0]).toBe('! synthetic demo data');
			expect(lines[1]).toBe('! two lines');
			expect(lines[2]).toBe(`# MHz S ${format} R 50`);
			const r = parseTouchstone(text);
			if (!r.ok) throw new Error(r.error.message);
			expect(r.sweep.f_hz.length).toBe(301);
			expect(r.sweep.comments).toContain('synthetic demo data');
			for (let i = 0; i < 301; i += 25) {
				expect(r.sweep.f_hz[i]).toBeCloseTo(s.f_hz[i], 0);
				expect(r.sweep.re[i]).toBeCloseTo(s.re[i], 5);
				expect(r.sweep.im[i]).toBeCloseTo(s.im[i], 5);
			}
		});
	}
});

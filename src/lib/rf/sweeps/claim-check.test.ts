import { describe, expect, it } from 'vitest';
import { analyzeSweep, checkClaim } from './claim-check';
import { rlcSweep } from '../../testing/sweeps/rlc';
import { seededRandom } from './synthetic';
import { vswrBands, vswrSeries } from './metrics';

// Hand-made VSWR curve, piecewise linear between the points: f = 10..60, VSWR below.
const f = [10, 20, 30, 40, 50, 60];
const v = [3, 1.8, 1.2, 1.4, 1.9, 2.6];

describe('checkClaim', () => {
	it('passes when the claimed band lies inside one VSWR ≤ ceiling band', () => {
		const r = checkClaim(f, v, { band_lo_hz: 20, band_hi_hz: 50, vswr_max: 2 });
		expect(r.pass).toBe(true);
		expect(r.miss_lo_hz).toBe(0);
		expect(r.miss_hi_hz).toBe(0);
		expect(r.worst_vswr_in_band).toBe(1.9);
	});

	it('misses by the interpolated shortfall on each side, worst VSWR includes the edges', () => {
		// [calc] VSWR 2 crossings: 10 + 10·(2 − 3)/(1.8 − 3) = 18.3333 and 50 + 10·(2 − 1.9)/(2.6 − 1.9) = 51.4286
		// claim 15..55: shortfall 3.3333 below, 3.5714 above; VSWR at 15 = (3 + 1.8)/2 = 2.4,
		// at 55 = (1.9 + 2.6)/2 = 2.25 → worst 2.4
		const r = checkClaim(f, v, { band_lo_hz: 15, band_hi_hz: 55, vswr_max: 2 });
		expect(r.pass).toBe(false);
		expect(r.miss_lo_hz).toBeCloseTo(3.3333, 4);
		expect(r.miss_hi_hz).toBeCloseTo(3.5714, 4);
		expect(r.worst_vswr_in_band).toBeCloseTo(2.4, 12);
	});

	it('a claim reaching past the sweep is not demonstrated', () => {
		const r = checkClaim(f, v, { band_lo_hz: 25, band_hi_hz: 70, vswr_max: 3 });
		expect(r.pass).toBe(false);
		expect(r.miss_hi_hz).toBe(10);
		expect(r.worst_vswr_in_band).toBe(2.6);
		expect(
			checkClaim(f, v, { band_lo_hz: 70, band_hi_hz: 80, vswr_max: 3 }).worst_vswr_in_band
		).toBeNull();
	});

	it('no point under the ceiling: no shortfall figure', () => {
		const r = checkClaim(f, v, { band_lo_hz: 20, band_hi_hz: 30, vswr_max: 1.1 });
		expect(r).toEqual({ pass: false, worst_vswr_in_band: 1.8, miss_lo_hz: null, miss_hi_hz: null });
	});

	it('with no overlap, the nearest band tells how far the resonance must move', () => {
		// bands ≤ 1.5 of a dip near 30: from 20 + 10·(1.5 − 1.8)/(1.2 − 1.8) = 25 to 40 + 10·(0.1/0.5) = 42 [calc]
		const r = checkClaim(f, v, { band_lo_hz: 50, band_hi_hz: 55, vswr_max: 1.5 });
		expect(r.miss_lo_hz).toBe(0);
		expect(r.miss_hi_hz).toBeCloseTo(13, 10);
	});

	it('refuses an inverted band with a RangeError (validate user input first)', () => {
		expect(() => checkClaim(f, v, { band_lo_hz: 5, band_hi_hz: 5, vswr_max: 2 })).toThrow(
			RangeError
		);
	});

	it('property: for claims inside the sweep, pass ⇔ worst VSWR in band ≤ ceiling', () => {
		const rand = seededRandom(3);
		const s = rlcSweep(2.45e9, 15, 60, 50, 2.2e9, 2.7e9, 401);
		const vs = vswrSeries(s);
		let checked = 0;
		for (let k = 0; k < 300; k++) {
			const a = 2.2e9 + rand() * 0.5e9;
			const b = a + rand() * (2.7e9 - a);
			if (!(b > a)) continue;
			const ceiling = 1.2 + rand() * 2;
			const r = checkClaim(s.f_hz, vs, { band_lo_hz: a, band_hi_hz: b, vswr_max: ceiling });
			const worst = r.worst_vswr_in_band as number;
			if (Math.abs(worst - ceiling) < 1e-9) continue;
			expect(r.pass).toBe(worst <= ceiling);
			if (r.pass) expect([r.miss_lo_hz, r.miss_hi_hz]).toEqual([0, 0]);
			checked++;
		}
		expect(checked).toBeGreaterThan(250);
	});
});

describe('analyzeSweep on an analytic series-RLC resonator (R = Z0 = 50 Ω)', () => {
	// [calc] VSWR 2 ⇔ |X| = R/√2 (see sweep-metrics.test.ts); ω = (±Xe + √(Xe² + 4L/C))/(2L)
	const f0 = 2.45e9;
	const q = 12;
	const w0 = 2 * Math.PI * f0;
	const l = (q * 50) / w0;
	const c = 1 / (w0 * w0 * l);
	const xe = 50 / Math.SQRT2;
	const root = Math.sqrt(xe * xe + (4 * l) / c);
	const lo = (-xe + root) / (2 * l) / (2 * Math.PI);
	const hi = (xe + root) / (2 * l) / (2 * Math.PI);
	const s = rlcSweep(f0, q, 50, 50, 2.0e9, 2.9e9, 9001);

	it('passes a claim just inside the VSWR-2 band and misses a wider one by the closed-form amount', () => {
		const inside = analyzeSweep(s, { band_lo_hz: lo + 1e5, band_hi_hz: hi - 1e5, vswr_max: 2 });
		expect(inside.claim?.pass).toBe(true);
		const wide = analyzeSweep(s, { band_lo_hz: lo - 5e6, band_hi_hz: hi + 7e6, vswr_max: 2 });
		expect(wide.claim?.pass).toBe(false);
		expect(wide.claim?.miss_lo_hz).toBeCloseTo(5e6, -2);
		expect(wide.claim?.miss_hi_hz).toBeCloseTo(7e6, -2);
		expect(wide.claim?.worst_vswr_in_band).toBeGreaterThan(2);
	});

	it('reports the minimum at f0, VSWR 1 there, and the VSWR-2 band', () => {
		const r = analyzeSweep(s, { design_hz: f0 });
		expect(r.f_min_vswr_hz).toBeCloseTo(f0, -3);
		expect(r.min_vswr).toBeCloseTo(1, 3);
		expect(r.bands_vswr_2).toHaveLength(1);
		expect(r.bands_vswr_2[0][0]).toBeCloseTo(lo, -2);
		expect(r.bands_vswr_2[0][1]).toBeCloseTo(hi, -2);
		expect(r.vswr_at_design).toBeCloseTo(1, 2);
		expect(r.claim).toBeUndefined();
	});

	it('checks against precomputed bands when given them', () => {
		const vs = vswrSeries(s);
		const claim = { band_lo_hz: lo + 1e5, band_hi_hz: hi - 1e5, vswr_max: 2 };
		expect(checkClaim(s.f_hz, vs, claim, vswrBands(s.f_hz, vs, 2)).pass).toBe(true);
		expect(checkClaim(s.f_hz, vs, claim, []).pass).toBe(false);
	});
});

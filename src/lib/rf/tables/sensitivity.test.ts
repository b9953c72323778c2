import { describe, expect, it } from 'vitest';
import { C } from '../units/constants';
import { bandToleranceM, resonanceShiftHz, sensitivityFor } from './sensitivity';

describe('first-order sensitivity', () => {
	const f = 2.45e9;
	const quarter = C / f / 4;

	it('shift per +0.1 mm of a quarter wave at 2.45 GHz', () => {
		// [calc] Δf = −f ΔL / L = −2.45e9 × 0.1 / 30.5911 = −8.0089 MHz.
		const s = sensitivityFor(f, quarter);
		expect(s.hz_per_0_1mm / 1e6).toBeCloseTo(-8.0089, 3);
		expect(s.first_order).toBe(true);
		expect(s.tolerance_mm).toBeUndefined();
	});

	it('tolerance that keeps the resonance in the ISM band', () => {
		// ITU RR 5.150 ISM band 2400–2500 MHz; [calc] L × min(50, 50) MHz / 2450 MHz = 0.62431 mm.
		expect(bandToleranceM(f, quarter, [2.4e9, 2.5e9]) * 1000).toBeCloseTo(0.62431, 4);
		// 2400–2483.5 MHz national allocation [M]; [calc] min(33.5, 50) → 30.5911 × 33.5/2450 = 0.41829 mm.
		expect(sensitivityFor(f, quarter, [2.4e9, 2.4835e9]).tolerance_mm).toBeCloseTo(0.41829, 4);
	});

	it('no tolerance outside the band', () => {
		// [calc] f = 2.6 GHz is above 2.5 GHz: no length change brings it in without moving f itself.
		expect(bandToleranceM(2.6e9, quarter, [2.4e9, 2.5e9])).toBe(0);
	});

	it('a longer part lowers the resonance', () => {
		// [calc] Δf/f = −ΔL/L: +1 % length → −1 % frequency.
		expect(resonanceShiftHz(1e9, 0.1, 0.001)).toBeCloseTo(-1e7, 3);
	});
});

import { describe, expect, it } from 'vitest';
import {
	clamp,
	formatReadoutFrequency,
	frequencyAxis,
	frequencyUnitFor,
	linearScale,
	nearestIndex,
	niceStep,
	niceTicks,
	stepDecimals,
	tickCountFor
} from './chart-scale';

describe('linearScale', () => {
	it('maps and inverts a domain onto a reversed pixel range', () => {
		// [calc] y axis: VSWR 1 at the bottom (px 200), VSWR 5 at the top (px 0); 3 is half-way
		const s = linearScale([1, 5], [200, 0]);
		expect(s.map(1)).toBe(200);
		expect(s.map(5)).toBe(0);
		expect(s.map(3)).toBe(100);
		expect(s.invert(50)).toBe(4);
	});

	it('maps a zero-width domain to the middle of the range instead of dividing by zero', () => {
		// [calc] middle of [0, 100] is 50
		const s = linearScale([7, 7], [0, 100]);
		expect(s.map(123)).toBe(50);
		expect(s.invert(10)).toBe(7);
	});
});

describe('niceStep and niceTicks', () => {
	it('picks 1, 2 or 5 × 10ⁿ steps', () => {
		// [calc] 10/5 = 2 → 2; 0.3e9/6 = 5e7 → 5e7; 4/4 = 1 → 1; 1/3 ≈ 0.33 → 0.5 (3.3 ≥ √10)
		expect(niceStep(10, 5)).toBe(2);
		expect(niceStep(0.3e9, 6)).toBe(5e7);
		expect(niceStep(4, 4)).toBe(1);
		expect(niceStep(1, 3)).toBe(0.5);
		expect(niceStep(0, 5)).toBe(0);
	});

	it('covers the range with round values, ends included', () => {
		// [calc] multiples of 2 in [0, 10]
		expect(niceTicks(0, 10, 5)).toEqual([0, 2, 4, 6, 8, 10]);
		// [calc] multiples of 1 in [1, 5]
		expect(niceTicks(1, 5, 4)).toEqual([1, 2, 3, 4, 5]);
		// [calc] step 0.05 in [2.3, 2.6]: printed without binary noise (0.05 × 47 = 2.3500000000000001)
		expect(niceTicks(2.3, 2.6, 6)).toEqual([2.3, 2.35, 2.4, 2.45, 2.5, 2.55, 2.6]);
	});

	it('does not put ticks outside an unrounded range and accepts reversed ends', () => {
		// [calc] multiples of 5 (10 intervals wanted over 47 → 4.7 → 5) inside [2.2, 49.1]
		expect(niceTicks(49.1, 2.2, 10)).toEqual([5, 10, 15, 20, 25, 30, 35, 40, 45]);
	});

	it('handles degenerate ranges', () => {
		expect(niceTicks(3, 3, 5)).toEqual([3]);
		expect(niceTicks(Number.NaN, 3, 5)).toEqual([]);
	});

	it('counts decimals from the step', () => {
		// [calc] 0.05 needs 2 decimals, 0.5 needs 1, 2 and 50 need none
		expect(stepDecimals(0.05)).toBe(2);
		expect(stepDecimals(0.5)).toBe(1);
		expect(stepDecimals(2)).toBe(0);
		expect(stepDecimals(50)).toBe(0);
	});

	it('fits tick intervals to the pixel length', () => {
		// [calc] floor(600 / 90) = 6; never fewer than 2
		expect(tickCountFor(600, 90)).toBe(6);
		expect(tickCountFor(100, 90)).toBe(2);
	});
});

describe('frequencyAxis', () => {
	it('uses GHz for a 2.4 GHz sweep with labels of one precision', () => {
		// [calc] 2.3–2.6 GHz in 6 intervals → 50 MHz steps = 0.05 GHz, 2 decimals
		const axis = frequencyAxis(2.3e9, 2.6e9, 6);
		expect(axis.unit).toBe('GHz');
		expect(axis.title).toBe('Frequency (GHz)');
		expect(axis.ticks.map(axis.label)).toEqual([
			'2.30',
			'2.35',
			'2.40',
			'2.45',
			'2.50',
			'2.55',
			'2.60'
		]);
	});

	it('uses MHz below 1 GHz', () => {
		// [calc] 420–450 MHz in 3 intervals → 10 MHz steps
		const axis = frequencyAxis(420e6, 450e6, 3);
		expect(axis.unit).toBe('MHz');
		expect(axis.ticks.map(axis.label)).toEqual(['420', '430', '440', '450']);
	});

	it('chooses the unit from the magnitude', () => {
		expect(frequencyUnitFor(13.56e6).unit).toBe('MHz');
		expect(frequencyUnitFor(24.125e9).unit).toBe('GHz');
		expect(frequencyUnitFor(500).unit).toBe('Hz');
	});

	it('prints read-out frequencies fine enough to tell samples 1 MHz apart', () => {
		// [calc] 1 MHz = 0.001 GHz → 3 decimals; 0.25 MHz spacing → ceil(−log10 0.25) = 1 decimal (0.1 MHz < 0.25 MHz)
		expect(formatReadoutFrequency(2.4517e9, 1e6)).toBe('2.452 GHz');
		expect(formatReadoutFrequency(435.125e6, 0.25e6)).toBe('435.1 MHz');
	});
});

describe('nearestIndex and clamp', () => {
	it('finds the nearest sample in an ascending array', () => {
		const f = [1, 2, 4, 8];
		expect(nearestIndex(f, 2.9)).toBe(1);
		expect(nearestIndex(f, 3.1)).toBe(2);
		expect(nearestIndex(f, -10)).toBe(0);
		expect(nearestIndex(f, 100)).toBe(3);
		expect(nearestIndex([], 1)).toBe(-1);
	});

	it('clamps', () => {
		expect(clamp(7, 1, 5)).toBe(5);
		expect(clamp(-1, 1, 5)).toBe(1);
		expect(clamp(3, 1, 5)).toBe(3);
	});
});

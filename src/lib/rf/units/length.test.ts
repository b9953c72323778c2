import { describe, expect, it } from 'vitest';
import { formatFractionalInches, formatInches, formatLength, formatMm } from './length';

describe('length display', () => {
	it('fractional inches to the nearest 1/64, reduced', () => {
		// [calc] 31.2284 mm / 25.4 = 1.22946 in; × 64 = 78.69 → 79/64 = 1 15/64 in.
		expect(formatFractionalInches(31.2284)).toBe('1 15/64 in');
		// [calc] 9.525 mm = 0.375 in = 24/64 = 3/8 in.
		expect(formatFractionalInches(9.525)).toBe('3/8 in');
		// [calc] 50.8 mm = 2 in exactly.
		expect(formatFractionalInches(50.8)).toBe('2 in');
		// [calc] 25.0 mm = 0.98425 in × 64 = 62.99 → 63/64 in.
		expect(formatFractionalInches(25)).toBe('63/64 in');
		// [calc] 25.35 mm × 64 / 25.4 = 63.87 → 64/64 = 1 in (carries into the whole inch).
		expect(formatFractionalInches(25.35)).toBe('1 in');
		// [calc] 0.1 mm × 64 / 25.4 = 0.25 → 0 in.
		expect(formatFractionalInches(0.1)).toBe('0 in');
		// [calc] −31.75 mm = −1.25 in.
		expect(formatFractionalInches(-31.75)).toBe('-1 1/4 in');
	});

	it('decimal inches and millimetres', () => {
		// [calc] 30.5911 mm / 25.4 = 1.20437 in.
		expect(formatInches(30.5911)).toBe('1.204 in');
		expect(formatMm(30.5911)).toBe('30.59 mm');
		expect(formatLength(12.9221, 'mm')).toBe('12.92 mm');
		// [calc] 12.9221 mm = 0.50874 in; × 64 = 32.56 → 33/64 in.
		expect(formatLength(12.9221, 'in_frac')).toBe('33/64 in');
	});
});

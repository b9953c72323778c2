import { describe, expect, it } from 'vitest';
import {
	formatShift,
	formatSigned,
	formatToleranceMm,
	formatWavelengthMm,
	wavelengthMm
} from './display-format';

describe('wavelength', () => {
	it('is c / f in millimetres', () => {
		// [calc] formula λ = c/f, c = 299 792 458 m/s (SI Brochure, 9th ed.): 2.45 GHz → 122.364 mm
		expect(wavelengthMm(2.45e9)).toBeCloseTo(122.364, 3);
		// [calc] 5.8 GHz → 51.688 mm
		expect(formatWavelengthMm(wavelengthMm(5.8e9))).toBe('51.69 mm');
		expect(formatWavelengthMm(wavelengthMm(2.45e9))).toBe('122.4 mm');
	});

	it('groups the digits above a metre with a thin space', () => {
		// [calc] 13.56 MHz → 22 108.6 mm
		expect(formatWavelengthMm(wavelengthMm(13.56e6))).toBe('22\u2009109 mm');
		expect(formatWavelengthMm(0)).toBe('—');
	});
});

describe('signed values', () => {
	it('uses a true minus sign and an explicit plus', () => {
		expect(formatSigned(-12.34, 1)).toBe('\u221212.3');
		expect(formatSigned(0.8, 1)).toBe('+0.8');
		expect(formatSigned(-0.001, 1)).toBe('0.0');
	});

	it('prints shifts in MHz or kHz', () => {
		// [calc] Δf = −f·ΔL/L: 2.45 GHz, L = 30.6 mm, ΔL = 0.1 mm → −8.0065 MHz
		expect(formatShift((-2.45e9 * 0.1) / 30.6)).toBe('\u22128.01 MHz');
		// [calc] 144 MHz, L = 1000 mm, ΔL = 0.1 mm → −14.4 kHz
		expect(formatShift((-144e6 * 0.1) / 1000)).toBe('\u221214.4 kHz');
		expect(formatShift(3.2e6)).toBe('+3.20 MHz');
	});

	it('prints tolerances to two significant figures', () => {
		expect(formatToleranceMm(0.0834)).toBe('±0.083 mm');
		expect(formatToleranceMm(1.27)).toBe('±1.3 mm');
		expect(formatToleranceMm(12.4)).toBe('±12 mm');
	});
});

import { describe, expect, it } from 'vitest';
import { claimVerdict, fileSize, returnLossAtVswr, vswrText } from './measurement-text';

const claim = { band_lo_hz: 2.4e9, band_hi_hz: 2.5e9, vswr_max: 2, scaled: false };

describe('measurement words', () => {
	it('return loss at a VSWR ceiling', () => {
		// Pozar 4th ed. §2.3 relations; CHECKS.md table: VSWR 2 ↔ 9.542 dB, 1.5 ↔ 13.979 dB, 3 ↔ 6.021 dB
		expect(returnLossAtVswr(2)).toBeCloseTo(9.542, 3);
		expect(returnLossAtVswr(1.5)).toBeCloseTo(13.979, 3);
		expect(returnLossAtVswr(3)).toBeCloseTo(6.021, 3);
	});

	it('an infinite VSWR (null in the API) reads off the scale, never as a number', () => {
		expect(vswrText(null)).toBe('off the scale');
		expect(vswrText(1.5)).toBe('1.50');
	});

	it('says how much a claim is missed by, and on which side', () => {
		const miss = claimVerdict({
			...claim,
			pass: false,
			worst_vswr_in_band: 4.1,
			miss_lo_hz: 0,
			miss_hi_hz: 97.2e6
		});
		expect(miss.headline).toBe('Misses the claim');
		expect(miss.detail).toContain('falls short by 97.2 MHz at the top');
		expect(miss.detail).toContain('worst VSWR in band 4.10');
		const both = claimVerdict({
			...claim,
			pass: false,
			worst_vswr_in_band: 2.2,
			miss_lo_hz: 5e6,
			miss_hi_hz: 12e6
		});
		expect(both.detail).toContain('5.00 MHz at the bottom and 12.0 MHz at the top');
	});

	it('a pass, a sweep outside the band and one that never meets the ceiling', () => {
		expect(
			claimVerdict({ ...claim, pass: true, worst_vswr_in_band: 1.6, miss_lo_hz: 0, miss_hi_hz: 0 })
				.headline
		).toBe('Meets the claim');
		expect(
			claimVerdict({
				...claim,
				pass: false,
				worst_vswr_in_band: null,
				miss_lo_hz: null,
				miss_hi_hz: null
			}).headline
		).toBe('Not checked');
		expect(
			claimVerdict({
				...claim,
				pass: false,
				worst_vswr_in_band: 5,
				miss_lo_hz: null,
				miss_hi_hz: null
			}).detail
		).toMatch(/^No point/);
		expect(fileSize(2_500_000)).toBe('2.4 MB');
	});
});

import { describe, expect, it } from 'vitest';
import { BANDS, bandById, bandsContaining, overlaps } from './bands';

function edgesMHz(id: string): [number, number, number] {
	const band = bandById(id);
	if (!band) throw new Error(`no preset ${id}`);
	return [band.lo_hz / 1e6, band.centre_hz / 1e6, band.hi_hz / 1e6];
}

describe('band presets', () => {
	it('every preset has lo < centre < hi and a stated source', () => {
		expect(BANDS.length).toBeGreaterThan(10);
		for (const band of BANDS) {
			expect(band.lo_hz, band.id).toBeLessThan(band.centre_hz);
			expect(band.centre_hz, band.id).toBeLessThan(band.hi_hz);
			expect(band.source.length, band.id).toBeGreaterThan(10);
			// Anything not confirmed in the text must say so in its source line.
			if (band.confidence !== 'C') expect(band.source, band.id).toMatch(/memory|secondary/);
		}
	});

	it('ids are unique', () => {
		expect(new Set(BANDS.map((b) => b.id)).size).toBe(BANDS.length);
	});

	it('ISM edges follow ITU RR No. 5.150', () => {
		// ITU Radio Regulations No. 5.150 [C per CHECKS.md Bands]
		expect(edgesMHz('ism-2g4')).toEqual([2400, 2450, 2500]);
		expect(edgesMHz('ism-5g8')).toEqual([5725, 5800, 5875]);
		expect(edgesMHz('ism-915')).toEqual([902, 915, 928]);
		expect(bandById('ism-915')?.region).toBe('R2');
		expect(edgesMHz('ism-24g')).toEqual([24000, 24125, 24250]);
		// ITU RR No. 5.150, HF ISM bands (from memory)
		expect(edgesMHz('ism-13m56')).toEqual([13.553, 13.56, 13.567]);
		expect(edgesMHz('ism-27m12')).toEqual([26.957, 27.12, 27.283]);
		// ITU RR No. 5.138, Region 1 (from memory)
		expect(edgesMHz('ism-433')).toEqual([433.05, 433.92, 434.79]);
	});

	it('SRD edges follow ERC Rec 70-03 / ETSI EN 300 220 and national RLAN rules', () => {
		// ERC Recommendation 70-03 Annex 1 (from memory)
		expect(edgesMHz('srd-868').filter((_, i) => i !== 1)).toEqual([863, 870]);
		// 47 CFR 15.247 / ETSI EN 300 328 [M per CHECKS.md Bands]
		expect(edgesMHz('srd-2g4').filter((_, i) => i !== 1)).toEqual([2400, 2483.5]);
	});

	it('amateur edges follow ITU RR Article 5 by region', () => {
		// ITU RR Article 5 [C2 / M per CHECKS.md Bands]
		expect(edgesMHz('am-2m-r1').filter((_, i) => i !== 1)).toEqual([144, 146]);
		expect(edgesMHz('am-2m-r2r3').filter((_, i) => i !== 1)).toEqual([144, 148]);
		expect(edgesMHz('am-70cm-r1r3').filter((_, i) => i !== 1)).toEqual([430, 440]);
		expect(edgesMHz('am-70cm-r2').filter((_, i) => i !== 1)).toEqual([420, 450]);
		expect(edgesMHz('am-23cm').filter((_, i) => i !== 1)).toEqual([1240, 1300]);
		expect(edgesMHz('am-13cm').filter((_, i) => i !== 1)).toEqual([2300, 2450]);
		// ITU RR Article 5 (from memory)
		expect(edgesMHz('am-6cm').filter((_, i) => i !== 1)).toEqual([5650, 5850]);
		expect(edgesMHz('am-3cm').filter((_, i) => i !== 1)).toEqual([10000, 10500]);
	});
});

describe('lookups', () => {
	it('bandById returns undefined for an unknown id', () => {
		expect(bandById('ism-2g4')?.name).toMatch(/2\.4 GHz/);
		expect(bandById('nope')).toBeUndefined();
	});

	it('bandsContaining finds every band around 2.44 GHz, narrowest first', () => {
		const ids = bandsContaining(2.44e9).map((b) => b.id);
		expect(ids).toEqual(['srd-2g4', 'ism-2g4', 'am-13cm']);
	});

	it('bandsContaining includes the edges and nothing outside', () => {
		expect(bandsContaining(2.5e9).map((b) => b.id)).toEqual(['ism-2g4']);
		expect(bandsContaining(2.51e9)).toEqual([]);
		expect(bandsContaining(Number.NaN)).toEqual([]);
	});

	it('5.8 GHz falls in both the ISM band and the 6 cm amateur band', () => {
		expect(
			bandsContaining(5.8e9)
				.map((b) => b.id)
				.sort()
		).toEqual(['am-6cm', 'ism-5g8']);
	});

	it('overlaps is symmetric, order-tolerant, and excludes a shared edge point', () => {
		expect(overlaps(5650, 5850, 5725, 5875)).toBe(true);
		expect(overlaps(5725, 5875, 5650, 5850)).toBe(true);
		expect(overlaps(5850, 5650, 5875, 5725)).toBe(true);
		expect(overlaps(2300, 2400, 2400, 2500)).toBe(false);
		expect(overlaps(144, 146, 430, 440)).toBe(false);
		expect(overlaps(430, 440, 432, 433)).toBe(true);
		expect(overlaps(Number.NaN, 1, 0, 2)).toBe(false);
	});
});

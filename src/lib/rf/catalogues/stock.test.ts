import { describe, expect, it } from 'vitest';
import { CATALOGUES, CATALOGUE_IDS, awgDiameterM, snapToStock } from './stock';

describe('AWG, ASTM B258', () => {
	// [calc] d = 0.127 mm × 92^((36−n)/39) (ASTM B258 formula, CHECKS.md values).
	const values: [number, number][] = [
		[10, 2.588],
		[12, 2.053],
		[14, 1.628],
		[16, 1.291],
		[18, 1.024],
		[20, 0.812],
		[22, 0.644],
		[24, 0.511]
	];
	it.each(values)('AWG %i = %f mm', (n, d) => {
		expect(awgDiameterM(n) * 1000).toBeCloseTo(d, 3);
	});

	it('covers 0000 to 40', () => {
		// [calc] AWG 0000 (n = −3) = 0.127 × 92^(39/39) = 11.684 mm; AWG 36 = 0.127 mm by definition.
		const names = CATALOGUES.awg.map((i) => i.name);
		expect(names).toContain('AWG 0000');
		expect(names).toContain('AWG 40');
		expect(CATALOGUES.awg.find((i) => i.name === 'AWG 0000')?.value_m).toBeCloseTo(11.684e-3, 6);
		expect(CATALOGUES.awg.find((i) => i.name === 'AWG 36')?.value_m).toBeCloseTo(0.127e-3, 9);
		expect(CATALOGUES.awg).toHaveLength(44);
	});

	it('snaps to the nearest gauge', () => {
		// AWG 14 = 1.628 mm [calc ASTM B258]; 1.6 mm is nearer to it than to AWG 15 (1.450 mm).
		expect(snapToStock(1.6e-3, 'awg').name).toBe('AWG 14');
	});
});

describe('ISO 7089 washers (normal series)', () => {
	// ISO 7089 d1/d2: M3 3.2/7, M4 4.3/9, M5 5.3/10, M6 6.4/12, M8 8.4/16, M10 10.5/20, M12 13/24 [C2].
	const table: [string, number, number][] = [
		['M3', 3.2, 7],
		['M4', 4.3, 9],
		['M5', 5.3, 10],
		['M6', 6.4, 12],
		['M8', 8.4, 16],
		['M10', 10.5, 20],
		['M12', 13, 24]
	];
	it.each(table)('%s washer', (m, d1, d2) => {
		const od = CATALOGUES.washer_iso7089_od.find((i) => i.name === `${m} washer`);
		const id = CATALOGUES.washer_iso7089_id.find((i) => i.name === `${m} washer`);
		expect(od?.value_m).toBeCloseTo(d2 / 1000, 9);
		expect(id?.value_m).toBeCloseTo(d1 / 1000, 9);
	});

	it('names the chosen washer', () => {
		// ISO 7089 M10 d2 = 20 mm [C2]; 19.2 mm is nearer 20 than M8's 16.
		expect(snapToStock(19.2e-3, 'washer_iso7089_od')).toEqual({
			name: 'M10 washer',
			value_m: 0.02
		});
	});
});

describe('other stock', () => {
	it('PCB laminate thicknesses', () => {
		// Common laminate thicknesses (common practice): 1.6 mm is the usual FR-4 board.
		expect(snapToStock(1.52e-3, 'pcb_thickness').value_m).toBeCloseTo(1.6e-3, 9);
		expect(CATALOGUES.pcb_thickness.map((i) => Math.round(i.value_m * 1e4) / 10)).toEqual([
			0.2, 0.4, 0.6, 0.8, 1, 1.2, 1.6, 2, 2.4, 3.2
		]);
	});

	it('standoffs and tubes', () => {
		// Common M3 standoff lengths (common practice): 10 and 12 mm exist, 11 mm does not; a tie goes low.
		expect(snapToStock(11e-3, 'standoff').name).toBe('10 mm standoff');
		// ASTM B88 1/2 nominal tube has a 5/8 in OD = 15.875 mm (from memory); EN 1057 has 15 mm.
		expect(snapToStock(15.9e-3, 'copper_tube_od').name).toBe('5/8 in OD tube');
		expect(snapToStock(15.2e-3, 'copper_tube_od').name).toBe('15 mm OD tube');
	});

	it('every catalogue is sorted and non-empty', () => {
		// Property of the data: ascending values so nearest-snapping and listings read in order.
		for (const id of CATALOGUE_IDS) {
			const v = CATALOGUES[id].map((i) => i.value_m);
			expect(v.length).toBeGreaterThan(0);
			expect([...v].sort((a, b) => a - b)).toEqual(v);
		}
	});
});

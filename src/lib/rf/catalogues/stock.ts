/**
 * Stock catalogues for snapping. Values in metres, sorted ascending. Snap picks the nearest item
 * (ties go to the smaller one).
 */
import { MM_PER_INCH } from '../units/constants';
export interface StockItem {
	name: string;
	value_m: number;
}

export const CATALOGUE_IDS = [
	'awg',
	'metric_wire',
	'washer_iso7089_od',
	'washer_iso7089_id',
	'standoff',
	'pcb_thickness',
	'copper_tube_od'
] as const;

export type CatalogueId = (typeof CATALOGUE_IDS)[number];

export function isCatalogueId(id: string): id is CatalogueId {
	return (CATALOGUE_IDS as readonly string[]).includes(id);
}

/** ASTM B258: d = 0.127 mm × 92^((36 − n)/39); n = 0 is gauge 0, n = −3 is 0000. */
export function awgDiameterM(n: number): number {
	return 0.127e-3 * 92 ** ((36 - n) / 39);
}

function awgName(n: number): string {
	return n <= 0 ? `AWG ${'0'.repeat(1 - n)}` : `AWG ${n}`;
}

const mm = (v: number, name: string): StockItem => ({ name, value_m: v / 1000 });

const awg: StockItem[] = [];
for (let n = 40; n >= -3; n--) awg.push({ name: awgName(n), value_m: awgDiameterM(n) });

// IEC 60317 / IEC 60182 R20 nominal conductor diameters, 0.5–4 mm (from memory).
const metricWire = [
	0.5, 0.56, 0.63, 0.71, 0.8, 0.9, 1, 1.12, 1.25, 1.4, 1.6, 1.8, 2, 2.24, 2.5, 2.8, 3.15, 3.55, 4
].map((d) => mm(d, `${d} mm wire`));

// ISO 7089 normal series d1 (hole) / d2 (outside), mm. M3–M12 [C2 via CHECKS.md]; the rest from memory.
const ISO7089: [string, number, number][] = [
	['M2', 2.2, 5],
	['M2.5', 2.7, 6],
	['M3', 3.2, 7],
	['M4', 4.3, 9],
	['M5', 5.3, 10],
	['M6', 6.4, 12],
	['M8', 8.4, 16],
	['M10', 10.5, 20],
	['M12', 13, 24],
	['M14', 15, 28],
	['M16', 17, 30],
	['M20', 21, 37]
];

// Common M3 standoff lengths (common practice).
const standoff = [5, 6, 8, 10, 12, 15, 20, 25, 30, 35, 40].map((l) => mm(l, `${l} mm standoff`));

// Common laminate thicknesses (common practice; 1.6 mm is the usual FR-4 board).
const pcb = [0.2, 0.4, 0.6, 0.8, 1, 1.2, 1.6, 2, 2.4, 3.2].map((t) => mm(t, `${t} mm laminate`));

// EN 1057 metric ODs and ASTM B88/B280 imperial ODs (from memory).
const tubeMetric = [6, 8, 10, 12, 15, 18, 22, 28, 35, 42, 54].map((d) => mm(d, `${d} mm OD tube`));
const tubeInch: [string, number][] = [
	['1/8', 1 / 8],
	['3/16', 3 / 16],
	['1/4', 1 / 4],
	['5/16', 5 / 16],
	['3/8', 3 / 8],
	['1/2', 1 / 2],
	['5/8', 5 / 8],
	['3/4', 3 / 4],
	['7/8', 7 / 8],
	['1 1/8', 9 / 8],
	['1 3/8', 11 / 8],
	['1 5/8', 13 / 8],
	['2 1/8', 17 / 8]
];
const tube = [
	...tubeMetric,
	...tubeInch.map(([n, d]) => mm(d * MM_PER_INCH, `${n} in OD tube`))
].sort((a, b) => a.value_m - b.value_m);

export const CATALOGUES: Readonly<Record<CatalogueId, readonly StockItem[]>> = {
	awg,
	metric_wire: metricWire,
	washer_iso7089_od: ISO7089.map(([m, , d2]) => mm(d2, `${m} washer`)),
	washer_iso7089_id: ISO7089.map(([m, d1]) => mm(d1, `${m} washer`)),
	standoff,
	pcb_thickness: pcb,
	copper_tube_od: tube
};

/** Nearest stock item to a value in metres. */
export function snapToStock(valueM: number, id: CatalogueId): StockItem {
	const items = CATALOGUES[id];
	let best = items[0];
	for (const item of items) {
		if (Math.abs(item.value_m - valueM) < Math.abs(best.value_m - valueM)) best = item;
	}
	return best;
}

export function snapValue(valueM: number, id: CatalogueId): number {
	return snapToStock(valueM, id).value_m;
}

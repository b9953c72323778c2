/**
 * Band presets for the frequency control. Every edge carries where it comes from and how sure we are:
 * 'C' confirmed in the regulation text, 'C2' confirmed only through a secondary source quoting it,
 * 'M' from memory (check against the current regulation before relying on it).
 * Allocations differ by country and change; these presets are starting points, not legal advice.
 */

export type BandKind = 'ism' | 'amateur' | 'srd';
type BandRegion = 'R1' | 'R2' | 'R3' | 'R1+R3' | 'R2+R3' | 'EU' | 'national';
type SourceConfidence = 'C' | 'C2' | 'M';

export interface Band {
	id: string;
	name: string;
	lo_hz: number;
	hi_hz: number;
	/** ISM: the centre frequency the regulation names; otherwise the mid-band or usual design value. */
	centre_hz: number;
	kind: BandKind;
	/** ITU Region(s), or a national/regional regime; absent means the same edges in all three. */
	region?: BandRegion;
	source: string;
	confidence: SourceConfidence;
}

export const BANDS: readonly Band[] = [
	{
		id: 'ism-13m56',
		name: '13.56 MHz ISM',
		lo_hz: 13_553_000,
		hi_hz: 13_567_000,
		centre_hz: 13_560_000,
		kind: 'ism',
		source: 'ITU Radio Regulations No. 5.150: 13 553–13 567 kHz, centre 13 560 kHz (from memory)',
		confidence: 'M'
	},
	{
		id: 'ism-27m12',
		name: '27.12 MHz ISM',
		lo_hz: 26_957_000,
		hi_hz: 27_283_000,
		centre_hz: 27_120_000,
		kind: 'ism',
		source: 'ITU Radio Regulations No. 5.150: 26 957–27 283 kHz, centre 27 120 kHz (from memory)',
		confidence: 'M'
	},
	{
		id: 'ism-433',
		name: '433 MHz ISM (Region 1)',
		lo_hz: 433_050_000,
		hi_hz: 434_790_000,
		centre_hz: 433_920_000,
		kind: 'ism',
		region: 'R1',
		source: 'ITU Radio Regulations No. 5.138: 433.05–434.79 MHz, centre 433.92 MHz (from memory)',
		confidence: 'M'
	},
	{
		id: 'srd-868',
		name: '868 MHz SRD (Europe)',
		lo_hz: 863_000_000,
		hi_hz: 870_000_000,
		centre_hz: 868_000_000,
		kind: 'srd',
		region: 'EU',
		source:
			'CEPT ERC Recommendation 70-03 Annex 1 / ETSI EN 300 220: 863–870 MHz; 868 MHz is the usual ' +
			'design frequency (from memory)',
		confidence: 'M'
	},
	{
		id: 'ism-915',
		name: '915 MHz ISM (Region 2)',
		lo_hz: 902_000_000,
		hi_hz: 928_000_000,
		centre_hz: 915_000_000,
		kind: 'ism',
		region: 'R2',
		source: 'ITU Radio Regulations No. 5.150: 902–928 MHz in Region 2, centre 915 MHz',
		confidence: 'C'
	},
	{
		id: 'ism-2g4',
		name: '2.4 GHz ISM',
		lo_hz: 2_400_000_000,
		hi_hz: 2_500_000_000,
		centre_hz: 2_450_000_000,
		kind: 'ism',
		source: 'ITU Radio Regulations No. 5.150: 2400–2500 MHz, centre 2450 MHz',
		confidence: 'C'
	},
	{
		id: 'srd-2g4',
		name: '2.4 GHz short-range / RLAN',
		lo_hz: 2_400_000_000,
		hi_hz: 2_483_500_000,
		centre_hz: 2_441_750_000,
		kind: 'srd',
		region: 'national',
		source:
			'National allocation in many countries, e.g. US 47 CFR 15.247, EU ETSI EN 300 328: ' +
			'2400–2483.5 MHz; centre is mid-band (from memory)',
		confidence: 'M'
	},
	{
		id: 'ism-5g8',
		name: '5.8 GHz ISM',
		lo_hz: 5_725_000_000,
		hi_hz: 5_875_000_000,
		centre_hz: 5_800_000_000,
		kind: 'ism',
		source: 'ITU Radio Regulations No. 5.150: 5725–5875 MHz, centre 5800 MHz',
		confidence: 'C'
	},
	{
		id: 'ism-24g',
		name: '24 GHz ISM',
		lo_hz: 24_000_000_000,
		hi_hz: 24_250_000_000,
		centre_hz: 24_125_000_000,
		kind: 'ism',
		source: 'ITU Radio Regulations No. 5.150: 24.00–24.25 GHz, centre 24.125 GHz',
		confidence: 'C'
	},
	{
		id: 'am-2m-r1',
		name: '2 m amateur (Region 1)',
		lo_hz: 144_000_000,
		hi_hz: 146_000_000,
		centre_hz: 145_000_000,
		kind: 'amateur',
		region: 'R1',
		source:
			'ITU Radio Regulations Article 5, Region 1: 144–146 MHz (secondary source / from memory)',
		confidence: 'C2'
	},
	{
		id: 'am-2m-r2r3',
		name: '2 m amateur (Regions 2 and 3)',
		lo_hz: 144_000_000,
		hi_hz: 148_000_000,
		centre_hz: 146_000_000,
		kind: 'amateur',
		region: 'R2+R3',
		source:
			'ITU Radio Regulations Article 5, Regions 2 and 3: 144–148 MHz (secondary source / from memory)',
		confidence: 'C2'
	},
	{
		id: 'am-70cm-r1r3',
		name: '70 cm amateur (Regions 1 and 3)',
		lo_hz: 430_000_000,
		hi_hz: 440_000_000,
		centre_hz: 435_000_000,
		kind: 'amateur',
		region: 'R1+R3',
		source:
			'ITU Radio Regulations Article 5, Regions 1 and 3: 430–440 MHz (secondary source / from memory)',
		confidence: 'C2'
	},
	{
		id: 'am-70cm-r2',
		name: '70 cm amateur (Region 2)',
		lo_hz: 420_000_000,
		hi_hz: 450_000_000,
		centre_hz: 435_000_000,
		kind: 'amateur',
		region: 'R2',
		source:
			'ITU Radio Regulations Article 5, Region 2: 420–450 MHz (secondary source / from memory)',
		confidence: 'C2'
	},
	{
		id: 'am-23cm',
		name: '23 cm amateur',
		lo_hz: 1_240_000_000,
		hi_hz: 1_300_000_000,
		centre_hz: 1_270_000_000,
		kind: 'amateur',
		source: 'ITU Radio Regulations Article 5: 1240–1300 MHz (secondary source / from memory)',
		confidence: 'C2'
	},
	{
		id: 'am-13cm',
		name: '13 cm amateur',
		lo_hz: 2_300_000_000,
		hi_hz: 2_450_000_000,
		centre_hz: 2_375_000_000,
		kind: 'amateur',
		source: 'ITU Radio Regulations Article 5: 2300–2450 MHz (secondary source / from memory)',
		confidence: 'C2'
	},
	{
		id: 'am-6cm',
		name: '6 cm amateur',
		lo_hz: 5_650_000_000,
		hi_hz: 5_850_000_000,
		centre_hz: 5_750_000_000,
		kind: 'amateur',
		source:
			'ITU Radio Regulations Article 5: 5650–5850 MHz; Region 2 extends to 5925 MHz (from memory)',
		confidence: 'M'
	},
	{
		id: 'am-3cm',
		name: '3 cm amateur',
		lo_hz: 10_000_000_000,
		hi_hz: 10_500_000_000,
		centre_hz: 10_250_000_000,
		kind: 'amateur',
		source: 'ITU Radio Regulations Article 5: 10.0–10.5 GHz (from memory)',
		confidence: 'M'
	}
];

const BY_ID = new Map(BANDS.map((band) => [band.id, band]));

export function bandById(id: string): Band | undefined {
	return BY_ID.get(id);
}

/** Every preset whose edges include `hz` (edges inclusive), narrowest first. */
export function bandsContaining(hz: number): Band[] {
	if (!Number.isFinite(hz)) return [];
	return BANDS.filter((band) => hz >= band.lo_hz && hz <= band.hi_hz).sort(
		(a, b) => a.hi_hz - a.lo_hz - (b.hi_hz - b.lo_hz)
	);
}

/** True when two ranges share more than an edge point; arguments may come in either order. */
export function overlaps(aLo: number, aHi: number, bLo: number, bHi: number): boolean {
	if (![aLo, aHi, bLo, bHi].every(Number.isFinite)) return false;
	const [a0, a1] = aLo <= aHi ? [aLo, aHi] : [aHi, aLo];
	const [b0, b1] = bLo <= bHi ? [bLo, bHi] : [bHi, bLo];
	return a0 < b1 && b0 < a1;
}

import { downsampleMinMax } from './downsample';
import type { Sweep, SweepWarning } from './types';
import { aboveUnity } from './warnings';
import {
	findMinimumVswr,
	fractionalBandwidth,
	interpolateVswr,
	magnitudeFromVswr,
	returnLossDb,
	vswrBands,
	vswrSeries,
	type VswrBand
} from './metrics';

export interface Claim {
	band_lo_hz: number;
	band_hi_hz: number;
	vswr_max: number;
}

export interface ClaimResult {
	/** true iff the claimed band lies inside one band where VSWR ≤ vswr_max. */
	pass: boolean;
	/** Highest VSWR over the claimed band (interpolated at its edges); null when the sweep misses the band entirely. */
	worst_vswr_in_band: number | null;
	/** Hz by which the VSWR ≤ vswr_max band falls short below band_lo_hz (0 when covered); null when no point meets vswr_max. */
	miss_lo_hz: number | null;
	/** Hz by which that band falls short above band_hi_hz (0 when covered); null when no point meets vswr_max. */
	miss_hi_hz: number | null;
}

/**
 * Checks a claim against a sweep. The band measured against is the VSWR ≤ vswr_max band that
 * overlaps the claimed band most, or, when none overlaps, the nearest one: its shortfall on each
 * side says how far the resonance must move or widen. A claimed band reaching past the sweep is
 * not demonstrated, so it cannot pass.
 */
export function checkClaim(
	f: ArrayLike<number>,
	vswr: ArrayLike<number>,
	claim: Claim,
	bands: VswrBand[] = vswrBands(f, vswr, claim.vswr_max)
): ClaimResult {
	const { band_lo_hz: lo, band_hi_hz: hi, vswr_max } = claim;
	if (!(lo < hi) || !(vswr_max >= 1)) {
		throw new RangeError('claim needs band_lo_hz < band_hi_hz and vswr_max ≥ 1');
	}
	return {
		pass: bands.some((b) => b.lo_hz <= lo && hi <= b.hi_hz),
		worst_vswr_in_band: worstInBand(f, vswr, lo, hi),
		...shortfall(bands, lo, hi)
	};
}

function shortfall(bands: VswrBand[], lo: number, hi: number) {
	let best: VswrBand | null = null;
	let bestScore = -Infinity;
	for (const b of bands) {
		// overlap when positive, minus the gap when apart
		const score = Math.min(hi, b.hi_hz) - Math.max(lo, b.lo_hz);
		if (score > bestScore) {
			bestScore = score;
			best = b;
		}
	}
	if (!best) return { miss_lo_hz: null, miss_hi_hz: null };
	return { miss_lo_hz: Math.max(0, best.lo_hz - lo), miss_hi_hz: Math.max(0, hi - best.hi_hz) };
}

function worstInBand(
	f: ArrayLike<number>,
	vswr: ArrayLike<number>,
	lo: number,
	hi: number
): number | null {
	const n = f.length;
	if (n === 0 || hi < f[0] || lo > f[n - 1]) return null;
	const a = Math.max(lo, f[0]);
	const b = Math.min(hi, f[n - 1]);
	let worst = Math.max(
		interpolateVswr(f, vswr, a) ?? -Infinity,
		interpolateVswr(f, vswr, b) ?? -Infinity
	);
	for (let i = 0; i < n; i++) if (f[i] > a && f[i] < b && vswr[i] > worst) worst = vswr[i];
	return worst;
}

export interface AnalyzeOptions {
	design_hz?: number;
	band_lo_hz?: number;
	band_hi_hz?: number;
	/** VSWR ceiling of the claim; 2 when a band is given without it. */
	vswr_max?: number;
}

/** JSON-ready: infinite values (|Γ| = 1, or a perfect match for return loss) are null. */
export interface AnalyzeResult {
	points: number;
	f_start_hz: number;
	f_stop_hz: number;
	z0: number;
	min_vswr: number | null;
	f_min_vswr_hz: number;
	bands_vswr_2: [number, number][];
	bands_vswr_1_5: [number, number][];
	fractional_bandwidth: number | null;
	vswr_at_design: number | null;
	rl_at_design_db: number | null;
	claim?: ClaimResult;
	phase_known: boolean;
	/** What the reader changed or noticed (conversions, the parameter used) and points above |S11| = 1. */
	warnings: SweepWarning[];
	series: {
		f_hz: number[];
		vswr: (number | null)[];
		rl_db: (number | null)[];
		re: number[];
		im: number[];
	};
}

const SERIES_MAX_POINTS = 2000;

const finite = (x: number | null): number | null => (x !== null && Number.isFinite(x) ? x : null);

function pick(values: Float64Array, keep: Uint32Array): Float64Array {
	const out = new Float64Array(keep.length);
	for (let k = 0; k < keep.length; k++) out[k] = values[keep[k]];
	return out;
}

/**
 * Sweep metrics, claim check and a display series of at most 2000 points that keeps the VSWR
 * minimum. The minimum is parabolically interpolated (see findMinimumVswr); return loss at the
 * design frequency follows from the interpolated VSWR there. Points above |S11| = 1 stay in the
 * series (VSWR null: off the scale) but not in the metrics, which would otherwise break a band
 * at a glitch. Throws RangeError for a band with band_lo_hz ≥ band_hi_hz or only one edge:
 * validate user input with parseAnalyzeQuery first.
 */
export function analyzeSweep(sweep: Sweep, options: AnalyzeOptions = {}): AnalyzeResult {
	const n = sweep.f_hz.length;
	const vswrAll = vswrSeries(sweep);
	const over = aboveUnity(sweep);
	const keep = over.keep && over.keep.length > 0 ? over.keep : null;
	const f = keep ? pick(sweep.f_hz, keep) : sweep.f_hz;
	const vswr = keep ? pick(vswrAll, keep) : vswrAll;
	const min = findMinimumVswr(f, vswr);
	const b2 = vswrBands(f, vswr, 2);
	const pairs = (bands: VswrBand[]) => bands.map((b): [number, number] => [b.lo_hz, b.hi_hz]);
	const design =
		options.design_hz === undefined ? null : interpolateVswr(f, vswr, options.design_hz);
	const result: AnalyzeResult = {
		points: n,
		f_start_hz: sweep.f_hz[0],
		f_stop_hz: sweep.f_hz[n - 1],
		z0: sweep.z0,
		min_vswr: finite(min.vswr),
		f_min_vswr_hz: min.f_hz,
		bands_vswr_2: pairs(b2),
		bands_vswr_1_5: pairs(vswrBands(f, vswr, 1.5)),
		fractional_bandwidth: fractionalBandwidth(b2, f[min.index]),
		vswr_at_design: finite(design),
		rl_at_design_db: design === null ? null : finite(returnLossDb(magnitudeFromVswr(design))),
		phase_known: sweep.phase_known,
		warnings: [...(sweep.warnings ?? []), ...(over.warning ? [over.warning] : [])],
		series: { f_hz: [], vswr: [], rl_db: [], re: [], im: [] }
	};
	const { band_lo_hz: lo, band_hi_hz: hi } = options;
	if ((lo === undefined) !== (hi === undefined)) {
		throw new RangeError('a claimed band needs both band_lo_hz and band_hi_hz');
	}
	if (lo !== undefined && hi !== undefined) {
		const claim = checkClaim(f, vswr, {
			band_lo_hz: lo,
			band_hi_hz: hi,
			vswr_max: options.vswr_max ?? 2
		});
		result.claim = { ...claim, worst_vswr_in_band: finite(claim.worst_vswr_in_band) };
	}
	const s = result.series;
	for (const i of downsampleMinMax(vswrAll, SERIES_MAX_POINTS)) {
		s.f_hz.push(sweep.f_hz[i]);
		s.vswr.push(finite(vswrAll[i]));
		s.rl_db.push(finite(returnLossDb(Math.hypot(sweep.re[i], sweep.im[i]))));
		s.re.push(sweep.re[i]);
		s.im.push(sweep.im[i]);
	}
	return result;
}

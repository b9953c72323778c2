import { findMinimumVswr, vswrBands, vswrFromMagnitude, type VswrBand } from '../sweeps/metrics';
import type { Geometry } from './geometry';
import { MAX_DIRECT_SOLVES } from './limits';
import { aaa, evaluateFit, type RationalFit } from './rational';
import { solve, type Complex } from './solver';

/**
 * Predicted impedance over a band: direct solves at a few frequencies, a rational (AAA) fit
 * through them, and a check of that fit against direct solves at the midpoints between the
 * samples. Every other failing check joins the samples (the others stay checks), every interval
 * between samples without a check gets one at its middle, and the fit is made and checked again.
 * The curve reported is always the fit that was checked.
 */

export interface PredictedPoint {
	frequency_hz: number;
	z_re: number;
	z_im: number;
	vswr: number;
}

export interface ImpedanceSummary {
	reference_ohms: number;
	/** Series resonance (reactance through zero upwards) with the lowest VSWR; null when none lies in the sweep. */
	resonance_hz: number | null;
	/** The VSWR ≤ 2 band around the resonance (or the VSWR minimum); null when VSWR never reaches 2. */
	vswr2_band: VswrBand | null;
	min_vswr: { frequency_hz: number; vswr: number };
	points: PredictedPoint[];
}

interface FitCheck {
	/** Direct solves spent: samples plus checks. */
	direct_solves: number;
	/** Midpoints where the fit was compared with a direct solve. */
	checked_points: number;
	/** Largest |Γ_fit − Γ_direct| and |Z_fit − Z_direct| (Ω) there. */
	max_gamma_error: number;
	max_z_error_ohms: number;
	tolerance: number;
	within_tolerance: boolean;
}

export interface PredictedSweep extends ImpedanceSummary {
	/** null when every point was solved directly (short sweeps). */
	fit: FitCheck | null;
}

export function reflection(z: Complex, z0: number): Complex {
	const nr = z.re - z0,
		dr = z.re + z0;
	const d = dr * dr + z.im * z.im;
	return { re: (nr * dr + z.im * z.im) / d, im: (z.im * dr - nr * z.im) / d };
}

export const vswrOf = (z: Complex, z0: number) => {
	const g = reflection(z, z0);
	return vswrFromMagnitude(Math.hypot(g.re, g.im));
};

/** Bisection for a sign change of fn between a and b (fn(a), fn(b) of opposite signs). */
function bisect(fn: (f: number) => number, a: number, b: number): number {
	let fa = fn(a);
	for (let i = 0; i < 60 && b - a > 1e-9 * Math.abs(b); i++) {
		const m = (a + b) / 2;
		const fm = fn(m);
		if (fm === 0) return m;
		if (fm < 0 === fa < 0) [a, fa] = [m, fm];
		else b = m;
	}
	return (a + b) / 2;
}

/**
 * Resonance, VSWR ≤ 2 band and points from impedance samples; `at` (optional) gives the impedance
 * between samples, so crossings and band edges are found on it by bisection instead of by
 * linear interpolation.
 */
export function summarizeImpedance(
	f: ArrayLike<number>,
	z: Complex[],
	z0: number,
	at?: (f_hz: number) => Complex
): ImpedanceSummary {
	const n = f.length;
	const vswr = z.map((v) => vswrOf(v, z0));
	const points = z.map((v, i) => ({ frequency_hz: f[i], z_re: v.re, z_im: v.im, vswr: vswr[i] }));
	let resonance: number | null = null;
	let best = Infinity;
	for (let i = 0; i + 1 < n; i++) {
		if (!(z[i].im < 0 && z[i + 1].im >= 0)) continue;
		const fr = at
			? bisect((x) => at(x).im, f[i], f[i + 1])
			: f[i] + ((f[i + 1] - f[i]) * -z[i].im) / (z[i + 1].im - z[i].im);
		const v = at ? vswrOf(at(fr), z0) : Math.min(vswr[i], vswr[i + 1]);
		if (v < best) [best, resonance] = [v, fr];
	}
	const min = findMinimumVswr(f, vswr);
	const anchor = resonance ?? min.f_hz;
	const band = vswrBands(f, vswr, 2).find((b) => b.lo_hz <= anchor && anchor <= b.hi_hz) ?? null;
	if (band && at) {
		const excess = (x: number) => vswrOf(at(x), z0) - 2;
		const i = Array.prototype.findIndex.call(f, (x: number) => x >= band.lo_hz);
		if (!band.lo_at_sweep_start && i > 0) band.lo_hz = bisect(excess, f[i - 1], f[i]);
		let j = n - 1;
		while (j > 0 && f[j] > band.hi_hz) j--;
		if (!band.hi_at_sweep_stop && j + 1 < n) band.hi_hz = bisect(excess, f[j], f[j + 1]);
	}
	return {
		reference_ohms: z0,
		resonance_hz: resonance,
		vswr2_band: band,
		min_vswr: { frequency_hz: min.f_hz, vswr: min.vswr },
		points
	};
}

export interface SweepOptions {
	lo_hz: number;
	hi_hz: number;
	points: number;
	reference_ohms: number;
	/** Largest |ΔΓ| the fit may show at the checked midpoints. */
	tolerance?: number;
	/** First samples (evenly spaced, ends included). */
	initial_samples?: number;
}

const linspace = (a: number, b: number, n: number) =>
	Array.from({ length: n }, (_, i) => (n === 1 ? a : a + ((b - a) * i) / (n - 1)));

/** Predicted impedance sweep of a discretised model (see the module comment). */
export function predictSweep(g: Geometry, o: SweepOptions): PredictedSweep {
	const freqs = linspace(o.lo_hz, o.hi_hz, o.points);
	const tolerance = o.tolerance ?? 1e-3;
	const z0 = o.reference_ohms;
	const direct = (f: number): Complex => solve(g, f).z_in;
	const start = Math.max(3, o.initial_samples ?? 9);
	if (o.points <= start + 4 || !(o.hi_hz > o.lo_hz)) {
		const zs = freqs.map(direct);
		return { ...summarizeImpedance(freqs, zs, z0), fit: null };
	}
	const mid = (o.lo_hz + o.hi_hz) / 2;
	const half = (o.hi_hz - o.lo_hz) / 2;
	const xOf = (f: number) => (f - mid) / half;
	type Sample = { f: number; z: Complex };
	const solveAt = (f: number): Sample => ({ f, z: direct(f) });
	let samples: Sample[] = linspace(o.lo_hz, o.hi_hz, start).map(solveAt);
	let checks: Sample[] = [];
	let solves = samples.length;
	const out = [0, 0];
	for (;;) {
		// every interval between samples gets a check at its middle unless it holds one already
		const open = samples
			.slice(1)
			.map((s, i) => [samples[i].f, s.f])
			.filter(([lo, hi]) => !checks.some((c) => c.f > lo && c.f < hi));
		const room = Math.max(0, MAX_DIRECT_SOLVES - solves);
		const complete = open.length <= room;
		checks = checks
			.concat(open.slice(0, room).map(([lo, hi]) => solveAt((lo + hi) / 2)))
			.sort((x, y) => x.f - y.f);
		solves += Math.min(room, open.length);
		const fit: RationalFit = aaa(
			samples.map((s) => xOf(s.f)),
			Float64Array.from(samples.flatMap((s) => [s.z.re, s.z.im])),
			1e-9
		);
		const at = (f: number): Complex => (evaluateFit(fit, xOf(f), out), { re: out[0], im: out[1] });
		const errors = checks.map((c) => {
			const gd = reflection(c.z, z0);
			const gf = reflection(at(c.f), z0);
			const e = Math.hypot(gd.re - gf.re, gd.im - gf.im);
			return Number.isFinite(e) ? e : Infinity;
		});
		const gErr = Math.max(0, ...errors);
		const ok = complete && checks.length > 0 && gErr <= tolerance;
		if (ok || !complete || solves >= MAX_DIRECT_SOLVES) {
			const zErr = Math.max(
				0,
				...checks.map((c) => Math.hypot(c.z.re - at(c.f).re, c.z.im - at(c.f).im))
			);
			const summary = summarizeImpedance(freqs, freqs.map(at), z0, at);
			const fitCheck: FitCheck = {
				direct_solves: solves,
				checked_points: checks.length,
				max_gamma_error: gErr,
				max_z_error_ohms: zErr,
				tolerance,
				within_tolerance: ok
			};
			return { ...summary, fit: fitCheck };
		}
		// Every other failing check becomes a sample; the rest stay checks of the next fit.
		const promote = new Set(
			checks.filter((_, i) => errors[i] > tolerance).filter((_, i) => i % 2 === 0)
		);
		samples = [...samples, ...promote].sort((x, y) => x.f - y.f);
		checks = checks.filter((c) => !promote.has(c));
	}
}

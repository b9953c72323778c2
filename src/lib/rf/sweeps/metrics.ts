import type { Sweep } from './types';

/*
 * Reflection relations (Pozar, Microwave Engineering, 4th ed., §2.3):
 * VSWR = (1+|Γ|)/(1−|Γ|), RL = −20 log10|Γ| dB, ML = −10 log10(1−|Γ|²) dB, Z = Z0 (1+Γ)/(1−Γ).
 * Between sweep points VSWR is taken as piecewise linear in frequency: band edges, values at the
 * design frequency and at claimed band edges all come from that one curve, so they agree.
 */

export function vswrFromMagnitude(mag: number): number {
	return mag >= 1 ? Infinity : (1 + mag) / (1 - mag);
}
export function magnitudeFromVswr(vswr: number): number {
	return vswr === Infinity ? 1 : (vswr - 1) / (vswr + 1);
}
export function returnLossDb(mag: number): number {
	return -20 * Math.log10(mag);
}
export function mismatchLossDb(mag: number): number {
	return mag >= 1 ? Infinity : -10 * Math.log10(1 - mag * mag);
}
/** Z = Z0 (1+Γ)/(1−Γ); Γ = 1 (open circuit) gives Infinity. */
export function impedanceFromGamma(re: number, im: number, z0: number): { re: number; im: number } {
	const dr = 1 - re;
	const d = dr * dr + im * im;
	if (d === 0) return { re: Infinity, im: 0 };
	const nr = 1 + re;
	return { re: (z0 * (nr * dr - im * im)) / d, im: (z0 * (im * dr + nr * im)) / d };
}

export interface PointMetrics {
	mag: Float64Array;
	vswr: Float64Array;
	rl_db: Float64Array;
	ml_db: Float64Array;
	z_re: Float64Array;
	z_im: Float64Array;
}

export function pointMetrics(sweep: Sweep): PointMetrics {
	const n = sweep.f_hz.length;
	const out: PointMetrics = {
		mag: new Float64Array(n),
		vswr: new Float64Array(n),
		rl_db: new Float64Array(n),
		ml_db: new Float64Array(n),
		z_re: new Float64Array(n),
		z_im: new Float64Array(n)
	};
	for (let i = 0; i < n; i++) {
		const m = Math.min(1, Math.hypot(sweep.re[i], sweep.im[i]));
		out.mag[i] = m;
		out.vswr[i] = vswrFromMagnitude(m);
		out.rl_db[i] = returnLossDb(m);
		out.ml_db[i] = mismatchLossDb(m);
		const z = impedanceFromGamma(sweep.re[i], sweep.im[i], sweep.z0);
		out.z_re[i] = z.re;
		out.z_im[i] = z.im;
	}
	return out;
}

/** VSWR magnitudes only (the hot path of analysis). */
export function vswrSeries(sweep: Sweep): Float64Array {
	const n = sweep.f_hz.length;
	const v = new Float64Array(n);
	for (let i = 0; i < n; i++) v[i] = vswrFromMagnitude(Math.hypot(sweep.re[i], sweep.im[i]));
	return v;
}

export interface VswrMinimum {
	f_hz: number;
	vswr: number;
	index: number;
	/** true when f_hz and vswr come from a parabola through the lowest point and its two neighbours. */
	min_interpolated: boolean;
}

/**
 * Minimum VSWR, refined by parabolic interpolation through the lowest sample and its neighbours
 * (the vertex, kept between the neighbours and no lower than VSWR 1). At a sweep end, or when a
 * neighbour is infinite, the sample itself is returned with min_interpolated false.
 */
export function findMinimumVswr(f: ArrayLike<number>, v: ArrayLike<number>): VswrMinimum {
	let k = 0;
	for (let i = 1; i < v.length; i++) if (v[i] < v[k]) k = i;
	const sample = { f_hz: f[k], vswr: v[k], index: k, min_interpolated: false };
	if (k === 0 || k === v.length - 1) return sample;
	const x0 = f[k - 1],
		x1 = f[k],
		x2 = f[k + 1];
	const y0 = v[k - 1],
		y1 = v[k],
		y2 = v[k + 1];
	if (!Number.isFinite(y0) || !Number.isFinite(y2)) return sample;
	const a = (x1 - x0) * (y1 - y2);
	const b = (x1 - x2) * (y1 - y0);
	const den = a - b;
	if (den === 0) return sample;
	let x = x1 - (0.5 * ((x1 - x0) * a - (x1 - x2) * b)) / den;
	x = Math.min(x2, Math.max(x0, x));
	const y =
		(y0 * (x - x1) * (x - x2)) / ((x0 - x1) * (x0 - x2)) +
		(y1 * (x - x0) * (x - x2)) / ((x1 - x0) * (x1 - x2)) +
		(y2 * (x - x0) * (x - x1)) / ((x2 - x0) * (x2 - x1));
	return { f_hz: x, vswr: Math.max(1, Math.min(y1, y)), index: k, min_interpolated: true };
}

export interface VswrBand {
	lo_hz: number;
	hi_hz: number;
	/** The band reaches the first sweep point: its true lower edge may lie below the sweep. */
	lo_at_sweep_start: boolean;
	/** The band reaches the last sweep point: its true upper edge may lie above the sweep. */
	hi_at_sweep_stop: boolean;
}

function crossing(
	f: ArrayLike<number>,
	v: ArrayLike<number>,
	out: number,
	inside: number,
	ceiling: number
): number {
	if (!Number.isFinite(v[out])) return f[inside];
	return f[out] + ((ceiling - v[out]) * (f[inside] - f[out])) / (v[inside] - v[out]);
}

/** Every band where VSWR ≤ ceiling, edges by linear interpolation between the points around each crossing. */
export function vswrBands(f: ArrayLike<number>, v: ArrayLike<number>, ceiling: number): VswrBand[] {
	const bands: VswrBand[] = [];
	const n = v.length;
	let i = 0;
	while (i < n) {
		if (!(v[i] <= ceiling)) {
			i++;
			continue;
		}
		const s = i;
		while (i + 1 < n && v[i + 1] <= ceiling) i++;
		const e = i;
		bands.push({
			lo_hz: s === 0 ? f[0] : crossing(f, v, s - 1, s, ceiling),
			hi_hz: e === n - 1 ? f[n - 1] : crossing(f, v, e + 1, e, ceiling),
			lo_at_sweep_start: s === 0,
			hi_at_sweep_stop: e === n - 1
		});
		i = e + 1;
	}
	return bands;
}

/** VSWR at x on the piecewise-linear curve; null outside the sweep. */
export function interpolateVswr(
	f: ArrayLike<number>,
	v: ArrayLike<number>,
	x: number
): number | null {
	const n = f.length;
	if (n === 0 || !(x >= f[0] && x <= f[n - 1])) return null;
	let lo = 0;
	let hi = n - 1;
	while (hi - lo > 1) {
		const mid = (lo + hi) >> 1;
		if (f[mid] <= x) lo = mid;
		else hi = mid;
	}
	if (f[lo] === x) return v[lo];
	if (f[hi] === x) return v[hi];
	if (!Number.isFinite(v[lo]) || !Number.isFinite(v[hi])) return Infinity;
	return v[lo] + ((v[hi] - v[lo]) * (x - f[lo])) / (f[hi] - f[lo]);
}

/** (hi − lo) / centre, centre = (hi + lo)/2, of the band that contains frequency fc; null if none does. */
export function fractionalBandwidth(bands: VswrBand[], fc: number): number | null {
	const b = bands.find((x) => x.lo_hz <= fc && fc <= x.hi_hz);
	if (!b) return null;
	const centre = (b.lo_hz + b.hi_hz) / 2;
	return centre > 0 ? (b.hi_hz - b.lo_hz) / centre : null;
}

/** Γ referred to z0From, re-referred to z0To: Γ' = (a + bΓ)/(b + aΓ), a = z0From − z0To, b = z0From + z0To. */
export function renormalizeSweep(sweep: Sweep, z0To: number): Sweep {
	const a = sweep.z0 - z0To;
	const b = sweep.z0 + z0To;
	const n = sweep.f_hz.length;
	const re = new Float64Array(n);
	const im = new Float64Array(n);
	for (let i = 0; i < n; i++) {
		const gr = sweep.re[i];
		const gi = sweep.im[i];
		const nr = a + b * gr;
		const ni = b * gi;
		const dr = b + a * gr;
		const di = a * gi;
		const d = dr * dr + di * di;
		re[i] = (nr * dr + ni * di) / d;
		im[i] = (ni * dr - nr * di) / d;
	}
	const note = `renormalized from ${sweep.z0} ohm to ${z0To} ohm`;
	return { ...sweep, z0: z0To, re, im, comments: [...sweep.comments, note] };
}

/** Pure helpers behind SweepChart: series shapes, line paths with gaps, best points, value text. */

export type SweepQuantity = 'vswr' | 'rl_db';

export interface SweepPoint {
	f_hz: number;
	value: number;
}

export interface SweepSeries {
	label: string;
	/** Ascending frequencies in Hz. */
	f_hz: number[];
	/** VSWR (≥ 1) or return loss in positive dB, one per frequency; null is a gap (for VSWR: off the scale). */
	values: (number | null)[];
	colorIndex?: number;
	/** The point to mark; when absent the lowest VSWR (highest return loss) is found. */
	minimum?: SweepPoint;
}

const usable = (v: number | null | undefined): v is number =>
	typeof v === 'number' && Number.isFinite(v);

/**
 * SVG path data; a null or non-finite value ends the current subpath, so the line breaks there,
 * unless `nullAt` is given: then a null is drawn at that value (an infinite VSWR at the top edge).
 */
export function linePath(
	f: ArrayLike<number>,
	values: ArrayLike<number | null>,
	x: (hz: number) => number,
	y: (value: number) => number,
	nullAt?: number
): string {
	const parts: string[] = [];
	let run = 0;
	const n = Math.min(f.length, values.length);
	for (let i = 0; i < n; i++) {
		const v = values[i] === null && nullAt !== undefined ? nullAt : values[i];
		if (!usable(v) || !Number.isFinite(f[i])) {
			if (run === 1) parts.push('h0');
			run = 0;
			continue;
		}
		parts.push(`${run === 0 ? 'M' : 'L'}${x(f[i]).toFixed(1)},${y(v).toFixed(1)}`);
		run++;
	}
	// a lone point between gaps draws as a dot (zero-length segment with round caps)
	if (run === 1) parts.push('h0');
	return parts.join(' ');
}

/** Lowest VSWR or highest return loss, the first one on ties; null when no value is usable. */
export function bestPoint(
	f: ArrayLike<number>,
	values: ArrayLike<number | null>,
	quantity: SweepQuantity
): SweepPoint | null {
	let best: SweepPoint | null = null;
	const n = Math.min(f.length, values.length);
	for (let i = 0; i < n; i++) {
		const v = values[i];
		if (!usable(v) || !Number.isFinite(f[i])) continue;
		const better = best === null || (quantity === 'vswr' ? v < best.value : v > best.value);
		if (better) best = { f_hz: f[i], value: v };
	}
	return best;
}

/** Top of the value axis: VSWR from 1 to max(5, ceiling + 1); return loss from 0 to a multiple of 10. */
export function valueAxisTop(
	quantity: SweepQuantity,
	series: readonly SweepSeries[],
	ceiling?: number
): number {
	if (quantity === 'vswr') return Math.max(5, usable(ceiling) ? Math.ceil(ceiling) + 1 : 0);
	let max = usable(ceiling) ? ceiling : 0;
	for (const s of series) for (const v of s.values) if (usable(v) && v > max) max = v;
	return Math.min(60, Math.max(20, Math.ceil((max + 2) / 10) * 10));
}

/** A value for the read-out: null is an infinite VSWR ('off scale'); undefined is no sample. */
export function formatSweepValue(
	value: number | null | undefined,
	quantity: SweepQuantity
): string {
	if (value === null && quantity === 'vswr') return 'off scale';
	if (!usable(value)) return '—';
	if (quantity === 'rl_db') return `${value.toFixed(1)} dB`;
	return value >= 10 ? value.toFixed(1) : value.toFixed(2);
}

export function quantityName(quantity: SweepQuantity): string {
	return quantity === 'vswr' ? 'VSWR' : 'Return loss';
}

/**
 * Label y positions that keep labels apart: taken in x order, a label within `dx` and `dy` of one
 * already placed moves to `dy` beyond it in `dir` (−1 up, 1 down) until it is clear.
 */
export function spreadLabels(
	points: readonly { x: number; y: number }[],
	dx: number,
	dy: number,
	dir: -1 | 1
): number[] {
	const order = points.map((_, i) => i).sort((a, b) => points[a].x - points[b].x);
	const placed: { x: number; y: number }[] = [];
	const out = points.map((p) => p.y);
	for (const i of order) {
		const x = points[i].x;
		let y = points[i].y;
		for (let guard = 0; guard <= points.length; guard++) {
			const hit = placed.find((p) => Math.abs(p.x - x) < dx && Math.abs(p.y - y) < dy);
			if (!hit) break;
			y = hit.y + dir * dy;
		}
		placed.push({ x, y });
		out[i] = y;
	}
	return out;
}

/** Lowest and highest finite frequency over all series; null when there is none. */
export function frequencyExtent(series: readonly SweepSeries[]): [number, number] | null {
	let lo = Infinity;
	let hi = -Infinity;
	for (const s of series)
		for (const f of s.f_hz)
			if (Number.isFinite(f)) {
				lo = Math.min(lo, f);
				hi = Math.max(hi, f);
			}
	return lo <= hi ? [lo, hi] : null;
}

/** The series with the most points: the cursor steps through its frequencies. */
export function densestSeries(series: readonly SweepSeries[]): SweepSeries | null {
	let best: SweepSeries | null = null;
	for (const s of series) if (!best || s.f_hz.length > best.f_hz.length) best = s;
	return best && best.f_hz.length > 0 ? best : null;
}

/** Pure scale and tick helpers for the SVG charts (no framework imports, shared by server and client). */
import { hzUnitFor } from '$lib/rf/units/frequency';
import type { FrequencyUnit } from '$lib/rf/sweeps/types';

export interface LinearScale {
	map(value: number): number;
	invert(px: number): number;
}

/** Maps domain [d0, d1] onto range [r0, r1]; a zero-width domain maps everything to the range middle. */
export function linearScale(domain: [number, number], range: [number, number]): LinearScale {
	const [d0, d1] = domain;
	const [r0, r1] = range;
	const span = d1 - d0;
	if (span === 0 || !Number.isFinite(span)) {
		const mid = (r0 + r1) / 2;
		return { map: () => mid, invert: () => d0 };
	}
	const k = (r1 - r0) / span;
	return { map: (v) => r0 + (v - d0) * k, invert: (px) => d0 + (px - r0) / k };
}

export function clamp(value: number, lo: number, hi: number): number {
	return Math.min(hi, Math.max(lo, value));
}

/** A 1, 2 or 5 × 10ⁿ step giving about `count` intervals over `span` (thresholds at √2, √10, √50). */
export function niceStep(span: number, count: number): number {
	if (!(span > 0) || !Number.isFinite(span) || !(count >= 1)) return 0;
	const raw = span / count;
	const power = Math.floor(Math.log10(raw));
	const err = raw / 10 ** power;
	const m = err >= Math.sqrt(50) ? 10 : err >= Math.sqrt(10) ? 5 : err >= Math.SQRT2 ? 2 : 1;
	// m / 10^-power is exact for negative powers where m * 10^power is not (0.1 * 3 ≠ 0.3)
	return power < 0 ? m / 10 ** -power : m * 10 ** power;
}

/** Decimals needed to print multiples of `step` without rounding them together. */
export function stepDecimals(step: number): number {
	if (!(step > 0) || !Number.isFinite(step)) return 0;
	return Math.max(0, Math.ceil(-Math.log10(step) - 1e-9));
}

/** Round-number ticks inside [min, max] (both ends inclusive), about `count` intervals apart. */
export function niceTicks(min: number, max: number, count = 5): number[] {
	if (!Number.isFinite(min) || !Number.isFinite(max)) return [];
	const lo = Math.min(min, max);
	const hi = Math.max(min, max);
	if (lo === hi) return [lo];
	const step = niceStep(hi - lo, Math.max(1, Math.round(count)));
	const decimals = stepDecimals(step);
	const first = Math.ceil(lo / step - 1e-9);
	const last = Math.floor(hi / step + 1e-9);
	const out: number[] = [];
	for (let i = first; i <= last; i++) out.push(Number((i * step).toFixed(decimals)));
	return out;
}

/** How many tick intervals fit in `lengthPx` with at least `spacingPx` between labels. */
export function tickCountFor(lengthPx: number, spacingPx: number): number {
	if (!(lengthPx > 0) || !(spacingPx > 0)) return 2;
	return Math.max(2, Math.floor(lengthPx / spacingPx));
}

/** Chart axes stop at GHz: a sweep above that is read in GHz too. */
export function frequencyUnitFor(maxHz: number): { unit: FrequencyUnit; divisor: number } {
	return hzUnitFor(maxHz, 'GHz') as { unit: FrequencyUnit; divisor: number };
}

export interface FrequencyAxis {
	unit: FrequencyUnit;
	divisor: number;
	/** Tick positions in Hz. */
	ticks: number[];
	/** Tick label in `unit`, without the unit ("2.45"). */
	label(hz: number): string;
	/** Axis title, "Frequency (GHz)". */
	title: string;
}

/** Frequency axis over [minHz, maxHz]: the unit follows the larger end, labels share one precision. */
export function frequencyAxis(minHz: number, maxHz: number, count = 5): FrequencyAxis {
	const { unit, divisor } = frequencyUnitFor(Math.max(Math.abs(minHz), Math.abs(maxHz)));
	const ticks = niceTicks(minHz / divisor, maxHz / divisor, count);
	const decimals = ticks.length > 1 ? stepDecimals(ticks[1] - ticks[0]) : 3;
	return {
		unit,
		divisor,
		ticks: ticks.map((t) => t * divisor),
		label: (hz) => (hz / divisor).toFixed(decimals),
		title: `Frequency (${unit})`
	};
}

/**
 * A read-out frequency with enough decimals to tell neighbouring samples apart
 * (`resolutionHz` is the sample spacing), in the unit of its own magnitude.
 */
export function formatReadoutFrequency(hz: number, resolutionHz: number): string {
	if (!Number.isFinite(hz)) return '—';
	const { unit, divisor } = frequencyUnitFor(hz);
	const r = Math.abs(resolutionHz) / divisor;
	const decimals = r > 0 && Number.isFinite(r) ? Math.min(6, stepDecimals(r)) : 3;
	return `${(hz / divisor).toFixed(decimals)} ${unit}`;
}

/** Index of the element of an ascending array nearest to `value`; −1 for an empty array. */
export function nearestIndex(sorted: ArrayLike<number>, value: number): number {
	const n = sorted.length;
	if (n === 0 || Number.isNaN(value)) return -1;
	let lo = 0;
	let hi = n - 1;
	while (hi - lo > 1) {
		const mid = (lo + hi) >> 1;
		if (sorted[mid] <= value) lo = mid;
		else hi = mid;
	}
	return Math.abs(sorted[hi] - value) < Math.abs(value - sorted[lo]) ? hi : lo;
}

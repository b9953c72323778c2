/**
 * What is odd about a sweep that still loads, and the line past which it cannot be a passive
 * one-port. A passive load reflects at most what it receives (|Γ| ≤ 1, Pozar, Microwave
 * Engineering, 4th ed., §2.3). Near total reflection a calibrated instrument reads a little over
 * 1; a glitch or an uncalibrated sweep can put a single point far over it. Data with most points
 * above NOT_PASSIVE_MAGNITUDE is refused instead: no passive antenna reads like that.
 */
import { formatFrequency } from '../units/frequency';
import type { Sweep, SweepWarning, SweepWarningCode } from './types';

/** |S11| above 1 by no more than printing round-off counts as 1. */
export const PASSIVE_TOLERANCE = 1e-9;
/** Refused when more than NOT_PASSIVE_SHARE of the points read |S11| above this. */
const NOT_PASSIVE_MAGNITUDE = 1.05;
const NOT_PASSIVE_SHARE = 0.5;
const UNITY_SQ = (1 + PASSIVE_TOLERANCE) ** 2;
export const FAR_SQ = NOT_PASSIVE_MAGNITUDE ** 2;
/** Up to 1 % over 1 is worded as calibration noise; further over, as a glitch. */
const NOISE_SQ = 1.01 ** 2;
const capital = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

export function note(code: SweepWarningCode, message: string): SweepWarning {
	return { code, message, count: null, max_excess: null, frequency_hz: null };
}

/** Points far above 1 met while reading: how many, where the first was, the largest |Γ|². */
export interface FarTally {
	count: number;
	max_sq: number;
	line: number;
	column: number;
}

export const newTally = (): FarTally => ({ count: 0, max_sq: 0, line: 0, column: 0 });

/** Records a point with |Γ|² = g2 read at line/column. */
export function tally(t: FarTally, g2: number, line: number, column: number): void {
	if (!(g2 > FAR_SQ)) return;
	if (t.count++ === 0) {
		t.line = line;
		t.column = column;
	}
	if (g2 > t.max_sq) t.max_sq = g2;
}

const CAUSES =
	'Likely causes: format letters or a quantity that do not match the numbers (DB, MA or RI; return loss or S11 in dB), dB values read as linear magnitudes or the reverse, or a gain measurement (S21 through an amplifier or a cable) instead of a reflection (S11).';

/**
 * The refusal for data that cannot be a passive one-port, or null when it can.
 * `hintOf` gives a sentence on the most likely cause in this file, or ''.
 */
export function notPassiveMessage(
	t: FarTally,
	points: number,
	hintOf: () => string
): string | null {
	if (!(t.count > points * NOT_PASSIVE_SHARE)) return null;
	const hint = hintOf();
	const largest = Math.sqrt(t.max_sq);
	const size = Number.isFinite(largest) && largest < 1e6 ? largest.toPrecision(4) : 'far more';
	return `not a passive one-port: |S11| is above ${NOT_PASSIVE_MAGNITUDE} at ${t.count} of ${points} points (largest ${size}), and no antenna or other passive load reflects more than it receives. ${hint ? hint + ' ' : ''}${CAUSES}`;
}

export interface AboveUnity {
	/** Indices of the points at or below |S11| = 1, ascending; null when every point is. */
	keep: Uint32Array | null;
	warning: SweepWarning | null;
}

/** Flags the points above |S11| = 1 and words the warning about them. */
export function aboveUnity(sweep: Sweep): AboveUnity {
	const { re, im, f_hz } = sweep;
	const n = f_hz.length;
	let count = 0;
	let far = 0;
	let worst = -1;
	let worstSq = 0;
	for (let i = 0; i < n; i++) {
		const g2 = re[i] * re[i] + im[i] * im[i];
		if (!(g2 > UNITY_SQ)) continue;
		count++;
		if (g2 > NOISE_SQ) far++;
		if (g2 > worstSq) {
			worstSq = g2;
			worst = i;
		}
	}
	if (count === 0) return { keep: null, warning: null };
	const keep = new Uint32Array(n - count);
	for (let i = 0, k = 0; i < n; i++) {
		if (!(re[i] * re[i] + im[i] * im[i] > UNITY_SQ)) keep[k++] = i;
	}
	const largest = Math.sqrt(worstSq);
	const excess = largest - 1;
	const at = formatFrequency(f_hz[worst], 6);
	const pct = `${(excess * 100).toPrecision(2)} % over`;
	const head =
		count === 1
			? `1 point reads |S11| above 1: ${largest.toFixed(4)} at ${at} (${pct}).`
			: `${count} of ${n} points read |S11| above 1, the largest ${largest.toFixed(4)} at ${at} (${pct}).`;
	const reflection = 'near total reflection (an open, a short, an antenna far out of its band)';
	const glitch = 'usually a glitch or a sweep taken without calibration';
	const why =
		far === 0
			? `${capital(reflection)} a calibrated instrument reads slightly over 1: calibration noise.`
			: far === count
				? `${far === 1 ? 'A point this far over 1 is' : 'Points this far over 1 are'} ${glitch}.`
				: `${count - far} of them are within 1 % of 1: calibration noise, as a calibrated instrument reads ${reflection}. ${far === 1 ? '1 is' : `${far} are`} further over: ${glitch}.`;
	const effect =
		count === n
			? 'No passive load reflects more than it receives, so VSWR is off the scale at every point and no VSWR figures could be derived.'
			: 'No passive load reflects more than it receives: VSWR there is off the scale, and these points are left out of the lowest VSWR, the VSWR ≤ 2 and ≤ 1.5 bands and the claim check.';
	return {
		keep: count === n ? new Uint32Array(0) : keep,
		warning: {
			code: 'above_unity',
			message: `${head} ${why} ${effect}`,
			count,
			max_excess: excess,
			frequency_hz: f_hz[worst]
		}
	};
}

import { HZ_PER_UNIT } from '../units/frequency';
import type { FrequencyUnit, Sweep } from './types';

/**
 * Synthetic 1-port sweeps from a series RLC resonator, Z = R + jωL + 1/(jωC), with
 * Q = ω0 L / R. For demo data and tests only: never a check value.
 */

export interface ResonatorOptions {
	f0_hz: number;
	q: number;
	/** Series resistance at resonance; defaults to z0 (a perfect match at f0). */
	r_ohm?: number;
	z0?: number;
	f_start_hz: number;
	f_stop_hz: number;
	points: number;
	/** Standard deviation of complex Gaussian noise added to Γ (per component). */
	noise?: number;
	seed?: number;
}

/** mulberry32: small, fast, seedable; enough for demo noise. */
export function seededRandom(seed: number): () => number {
	let a = seed >>> 0;
	return () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

/** Throws RangeError for impossible options (these come from code, never from users). */
export function syntheticResonatorSweep(o: ResonatorOptions): Sweep {
	const z0 = o.z0 ?? 50;
	const r = o.r_ohm ?? z0;
	const n = o.points;
	if (!(o.f0_hz > 0 && o.q > 0 && r > 0 && z0 > 0))
		throw new RangeError('f0_hz, q, r_ohm and z0 must be positive');
	if (!(Number.isInteger(n) && n >= 2)) throw new RangeError('points must be a whole number ≥ 2');
	if (!(o.f_start_hz >= 0 && o.f_stop_hz > o.f_start_hz))
		throw new RangeError('need 0 ≤ f_start_hz < f_stop_hz');
	const w0 = 2 * Math.PI * o.f0_hz;
	const l = (o.q * r) / w0;
	const c = 1 / (w0 * w0 * l);
	const rand = seededRandom(o.seed ?? 1);
	const gauss = () => Math.sqrt(-2 * Math.log(1 - rand())) * Math.cos(2 * Math.PI * rand());
	const sweep: Sweep = {
		source: 'touchstone',
		z0,
		f_hz: new Float64Array(n),
		re: new Float64Array(n),
		im: new Float64Array(n),
		comments: ['synthetic demo data: series RLC resonator model'],
		phase_known: true,
		version: 1
	};
	for (let i = 0; i < n; i++) {
		const f = o.f_start_hz + ((o.f_stop_hz - o.f_start_hz) * i) / (n - 1);
		const w = 2 * Math.PI * f;
		const x = w === 0 ? -Infinity : w * l - 1 / (w * c);
		let gr: number;
		let gi: number;
		if (!Number.isFinite(x)) {
			gr = 1;
			gi = 0;
		} else {
			// Γ = (R − Z0 + jX)/(R + Z0 + jX)
			const ar = r - z0;
			const br = r + z0;
			const d = br * br + x * x;
			gr = (ar * br + x * x) / d;
			gi = (x * br - ar * x) / d;
		}
		if (o.noise) {
			gr += o.noise * gauss();
			gi += o.noise * gauss();
			const m = Math.hypot(gr, gi);
			if (m > 1) {
				gr /= m;
				gi /= m;
			}
		}
		sweep.f_hz[i] = f;
		sweep.re[i] = gr;
		sweep.im[i] = gi;
	}
	return sweep;
}

export interface TouchstoneWriteOptions {
	unit: FrequencyUnit;
	format: 'DB' | 'MA' | 'RI';
	comments: string[];
}

/** Touchstone v1 1-port text: comment lines, `# <unit> S <format> R <z0>`, then one line per point. */
export function toTouchstone(sweep: Sweep, o: TouchstoneWriteOptions): string {
	const mult = HZ_PER_UNIT[o.unit];
	const f = sweep.f_hz;
	let step = Infinity;
	for (let i = 1; i < f.length; i++) step = Math.min(step, f[i] - f[i - 1]);
	// two digits finer than the closest spacing keeps printed frequencies strictly increasing
	const digits = Number.isFinite(step)
		? Math.min(15, Math.max(0, 2 - Math.floor(Math.log10(step / mult))))
		: 6;
	const lines = o.comments.map((c) => `! ${c.replace(/[\r\n]+/g, ' ')}`);
	lines.push(`# ${o.unit} S ${o.format} R ${sweep.z0}`);
	for (let i = 0; i < sweep.f_hz.length; i++) {
		const re = sweep.re[i];
		const im = sweep.im[i];
		let a: string;
		let b: string;
		if (o.format === 'RI') {
			a = re.toPrecision(10);
			b = im.toPrecision(10);
		} else {
			const mag = Math.hypot(re, im);
			const ang = ((Math.atan2(im, re) * 180) / Math.PI).toFixed(6);
			a = o.format === 'MA' ? mag.toPrecision(10) : (20 * Math.log10(mag)).toFixed(6);
			b = ang;
		}
		lines.push(`${(f[i] / mult).toFixed(digits)} ${a} ${b}`);
	}
	return lines.join('\n') + '\n';
}

/**
 * Textbook family formulas on plain SI numbers (Hz, m, dimensionless). Out-of-domain inputs give NaN
 * so callers decide how to report them; the formula layer turns NaN into a located message.
 */
import { C } from '../units/constants';

/** First zero of J1' (TE11) and of J0 (TM01): Pozar, Microwave Engineering 4th ed., Tables 3.3/3.4. */
export const P11_PRIME = 1.841183781;
export const P01 = 2.404825558;

/** Patch width, Balanis 3rd ed. §14.2 eq. 14-6: W = c/(2 fr) · √(2/(εr+1)). */
export function patchWidth(fr: number, er: number, c0: number = C): number {
	return (c0 / (2 * fr)) * Math.sqrt(2 / (er + 1));
}

/** Effective permittivity, Balanis §14.2 eq. 14-1 (valid for W/h > 1). */
export function patchEeff(er: number, h: number, w: number): number {
	return (er + 1) / 2 + ((er - 1) / 2) * (1 + (12 * h) / w) ** -0.5;
}

/** Length extension ΔL per edge, Hammerstad, Balanis §14.2 eq. 14-2. */
export function patchDeltaL(h: number, w: number, eeff: number): number {
	const wh = w / h;
	return (0.412 * h * ((eeff + 0.3) * (wh + 0.264))) / ((eeff - 0.258) * (wh + 0.8));
}

/** Resonant length L = c/(2 fr √εreff) − 2ΔL, Balanis §14.2 eq. 14-7. */
export function patchLength(fr: number, er: number, h: number, c0: number = C): number {
	const w = patchWidth(fr, er, c0);
	const eeff = patchEeff(er, h, w);
	return c0 / (2 * fr * Math.sqrt(eeff)) - 2 * patchDeltaL(h, w, eeff);
}

/** fc = p c / (2π a √εr) with a = d/2 (Pozar §3.4), for an inner diameter d. */
function cutoff(p: number, d: number, er: number): number {
	return d > 0 && er > 0 ? (p * C) / (Math.PI * d * Math.sqrt(er)) : NaN;
}

export function te11Cutoff(d: number, er = 1): number {
	return cutoff(P11_PRIME, d, er);
}

export function tm01Cutoff(d: number, er = 1): number {
	return cutoff(P01, d, er);
}

/** TE11 guide wavelength λg = λ / √(1 − (fc/f)²); NaN at or below cutoff (the mode does not propagate). */
export function guideWavelength(f: number, d: number, er = 1): number {
	const fc = te11Cutoff(d, er);
	if (!(f > fc)) return NaN;
	return C / (f * Math.sqrt(er)) / Math.sqrt(1 - (fc / f) ** 2);
}

/** Velocity factor of a TEM line with a non-magnetic dielectric. */
export function vfFromEr(er: number): number {
	return er > 0 ? 1 / Math.sqrt(er) : NaN;
}

/** Wavelength on a line with velocity factor vf. */
export function lambdaIn(f: number, vf: number): number {
	return (vf * C) / f;
}

/** |Γ| from VSWR (Pozar §2.3); VSWR below 1 is not a VSWR. */
export function gammaFromVswr(v: number): number {
	return v >= 1 ? (v - 1) / (v + 1) : NaN;
}

/** Return loss in dB (positive); a perfect match (VSWR 1) gives Infinity. */
export function rlFromVswr(v: number): number {
	return -20 * Math.log10(gammaFromVswr(v));
}

export function vswrFromRl(rlDb: number): number {
	if (!(rlDb >= 0)) return NaN;
	const g = 10 ** (-rlDb / 20);
	return (1 + g) / (1 - g);
}

/** Mismatch loss in dB: −10 log10(1 − |Γ|²). */
export function mismatchLoss(v: number): number {
	const g = gammaFromVswr(v);
	return -10 * Math.log10(1 - g * g);
}

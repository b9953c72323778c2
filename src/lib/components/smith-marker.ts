/** Γ at a chosen frequency and the impedance it stands for; pure helpers behind SmithChart. */

export interface GammaPoint {
	re: number;
	im: number;
	f_hz: number;
	/** True when Γ was interpolated between two samples rather than taken from one. */
	interpolated: boolean;
}

/**
 * Γ at `hz` by linear interpolation of re and im between the two neighbouring samples (ascending
 * `f`); outside the sweep the nearer end point is used. Null when there are no finite samples.
 */
export function gammaAt(
	f: ArrayLike<number>,
	re: ArrayLike<number>,
	im: ArrayLike<number>,
	hz: number
): GammaPoint | null {
	const n = Math.min(f.length, re.length, im.length);
	if (n === 0 || !Number.isFinite(hz)) return null;
	if (hz <= f[0]) return { re: re[0], im: im[0], f_hz: f[0], interpolated: false };
	if (hz >= f[n - 1]) return { re: re[n - 1], im: im[n - 1], f_hz: f[n - 1], interpolated: false };
	let lo = 0;
	let hi = n - 1;
	while (hi - lo > 1) {
		const mid = (lo + hi) >> 1;
		if (f[mid] <= hz) lo = mid;
		else hi = mid;
	}
	if (f[lo] === hz) return { re: re[lo], im: im[lo], f_hz: hz, interpolated: false };
	const t = (hz - f[lo]) / (f[hi] - f[lo]);
	return {
		re: re[lo] + t * (re[hi] - re[lo]),
		im: im[lo] + t * (im[hi] - im[lo]),
		f_hz: hz,
		interpolated: true
	};
}

/** Z = z0 (1 + Γ) / (1 − Γ) as r + jx ohms; null at Γ = 1 (an open circuit, infinite Z). */
export function impedanceFromGamma(
	re: number,
	im: number,
	z0 = 50
): { r: number; x: number } | null {
	const dRe = 1 - re;
	const d = dRe * dRe + im * im;
	if (!(d > 1e-12)) return null;
	// (1 + Γ)(1 − Γ*) / |1 − Γ|² = (1 − |Γ|² + 2j·im) / |1 − Γ|²
	return { r: (z0 * (1 - re * re - im * im)) / d, x: (z0 * 2 * im) / d };
}

const MINUS = '\u2212';

/** "48.7 + j3.2 Ω", "12 − j40 Ω" (one decimal below 100 Ω, whole ohms above). */
export function formatImpedance(z: { r: number; x: number } | null): string {
	if (!z) return 'open (Z → ∞)';
	const num = (v: number) => (Math.abs(v) >= 100 ? Math.abs(v).toFixed(0) : Math.abs(v).toFixed(1));
	// a value that rounds to zero prints unsigned ("50.0 + j0.0 Ω", never "− j0.0")
	const negative = (v: number) => v < 0 && Number(num(v)) !== 0;
	const r = `${negative(z.r) ? MINUS : ''}${num(z.r)}`;
	return `${r} ${negative(z.x) ? MINUS : '+'} j${num(z.x)} Ω`;
}

/** VSWR = (1 + |Γ|) / (1 − |Γ|); Infinity at |Γ| ≥ 1. */
export function vswrFromGamma(re: number, im: number): number {
	const m = Math.hypot(re, im);
	return m >= 1 ? Infinity : (1 + m) / (1 - m);
}

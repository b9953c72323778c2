import Complex from 'complex.js';
import type { Sweep } from '../../rf/sweeps/types';

/**
 * Series RLC 1-port built in the test with complex.js, independent of synthetic-sweep.ts:
 * Z = R + jωL + 1/(jωC), Q = ω0·L/R, ω0 = 1/√(LC).
 */
export function rlcImpedance(f: number, f0: number, q: number, r: number): Complex {
	const w0 = 2 * Math.PI * f0;
	const l = (q * r) / w0;
	const c = 1 / (w0 * w0 * l);
	const w = 2 * Math.PI * f;
	return new Complex(r, w * l).add(new Complex(0, w * c).inverse());
}

/** n frequencies from fa to fb, evenly spaced. */
export function grid(fa: number, fb: number, n: number): Float64Array {
	const f = new Float64Array(n);
	for (let i = 0; i < n; i++) f[i] = fa + ((fb - fa) * i) / (n - 1);
	return f;
}

/** Γ = (Z − Z0)/(Z + Z0) (Pozar, Microwave Engineering, 4th ed., §2.3). */
export function gammaOf(z: Complex, z0: number): Complex {
	return z.sub(z0).div(z.add(z0));
}

export function rlcSweep(
	f0: number,
	q: number,
	r: number,
	z0: number,
	fa: number,
	fb: number,
	n: number
): Sweep {
	const f = grid(fa, fb, n);
	const re = new Float64Array(n);
	const im = new Float64Array(n);
	for (let i = 0; i < n; i++) {
		const g = gammaOf(rlcImpedance(f[i], f0, q, r), z0);
		re[i] = g.re;
		im[i] = g.im;
	}
	return { source: 'touchstone', z0, f_hz: f, re, im, comments: [], phase_known: true };
}

/**
 * Closed-form edges of the band where |Γ| ≤ g for a series RLC with R = Z0 [calc]:
 * Γ = jX/(2R + jX), so |Γ|² = X²/(4R² + X²) and |Γ| = g at |X| = Xe = 2Rg/√(1 − g²)
 * (R/√2 at VSWR 2, R/√6 at VSWR 1.5); ωL − 1/(ωC) = ±Xe gives ω = (±Xe + √(Xe² + 4L/C))/(2L).
 */
export function rlcEdges(f0: number, q: number, r: number, vswr: number): [number, number] {
	const g = (vswr - 1) / (vswr + 1);
	const xe = (2 * r * g) / Math.sqrt(1 - g * g);
	const w0 = 2 * Math.PI * f0;
	const l = (q * r) / w0;
	const c = 1 / (w0 * w0 * l);
	const root = Math.sqrt(xe * xe + (4 * l) / c);
	return [(-xe + root) / (2 * l) / (2 * Math.PI), (xe + root) / (2 * l) / (2 * Math.PI)];
}

import Complex from 'complex.js';
import type { Sweep } from '../../rf/sweeps/types';

/** Series RLC 1-port built in the test with complex.js, independent of synthetic-sweep.ts. */
export function rlcSweep(
	f0: number,
	q: number,
	r: number,
	z0: number,
	fa: number,
	fb: number,
	n: number
): Sweep {
	const w0 = 2 * Math.PI * f0;
	const l = (q * r) / w0;
	const c = 1 / (w0 * w0 * l);
	const f = new Float64Array(n);
	const re = new Float64Array(n);
	const im = new Float64Array(n);
	for (let i = 0; i < n; i++) {
		f[i] = fa + ((fb - fa) * i) / (n - 1);
		const w = 2 * Math.PI * f[i];
		const z = new Complex(r, w * l).add(new Complex(0, w * c).inverse());
		const g = z.sub(z0).div(z.add(z0));
		re[i] = g.re;
		im[i] = g.im;
	}
	return { source: 'touchstone', z0, f_hz: f, re, im, comments: [], phase_known: true };
}

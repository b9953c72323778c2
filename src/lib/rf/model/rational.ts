/**
 * Rational approximation of complex samples on the real line by the AAA algorithm (Nakatsukasa,
 * Sète & Trefethen, "The AAA algorithm for rational approximation", SIAM J. Sci. Comput. 40(3),
 * 2018 [AAA2018]): barycentric form r(x) = Σ wⱼfⱼ/(x − xⱼ) / Σ wⱼ/(x − xⱼ), support points chosen
 * greedily where the error is largest, weights the smallest right singular vector of the Loewner
 * matrix (one-sided Jacobi SVD, Hestenes' method).
 */

export interface RationalFit {
	x: Float64Array;
	f: Float64Array;
	w: Float64Array;
	/** Largest |r − F| over the samples after the last step. */
	error: number;
}

/** Smallest right singular vector of the complex r×m matrix `a` (column-major, interleaved). */
export function smallestRightSingularVector(
	a: Float64Array,
	rows: number,
	cols: number
): Float64Array {
	const v = new Float64Array(2 * cols * cols);
	for (let i = 0; i < cols; i++) v[2 * (i * cols + i)] = 1;
	const col = (j: number) => 2 * rows * j;
	for (let sweep = 0; sweep < 60; sweep++) {
		let rotated = false;
		for (let i = 0; i < cols - 1; i++)
			for (let j = i + 1; j < cols; j++) {
				let al = 0,
					be = 0,
					gr = 0,
					gi = 0;
				const ci = col(i),
					cj = col(j);
				for (let r = 0; r < 2 * rows; r += 2) {
					const xr = a[ci + r],
						xi = a[ci + r + 1],
						yr = a[cj + r],
						yi = a[cj + r + 1];
					al += xr * xr + xi * xi;
					be += yr * yr + yi * yi;
					gr += xr * yr + xi * yi; // conj(x)·y
					gi += xr * yi - xi * yr;
				}
				const g = Math.hypot(gr, gi);
				if (g <= 1e-15 * Math.sqrt(al * be) || g === 0) continue;
				rotated = true;
				// column j times conj(e), e = γ/|γ|, makes the pair's Gram matrix real; then a real rotation
				const er = gr / g,
					ei = -gi / g;
				const zeta = (be - al) / (2 * g);
				const t = (zeta >= 0 ? 1 : -1) / (Math.abs(zeta) + Math.sqrt(1 + zeta * zeta));
				const c = 1 / Math.sqrt(1 + t * t);
				const s = c * t;
				const rot = (m: Float64Array, base: (k: number) => number, len: number) => {
					const bi = base(i),
						bj = base(j);
					for (let r = 0; r < len; r += 2) {
						const xr = m[bi + r],
							xi = m[bi + r + 1];
						const yr = m[bj + r] * er - m[bj + r + 1] * ei;
						const yi = m[bj + r] * ei + m[bj + r + 1] * er;
						m[bi + r] = c * xr - s * yr;
						m[bi + r + 1] = c * xi - s * yi;
						m[bj + r] = s * xr + c * yr;
						m[bj + r + 1] = s * xi + c * yi;
					}
				};
				rot(a, col, 2 * rows);
				rot(v, (k) => 2 * cols * k, 2 * cols);
			}
		if (!rotated) break;
	}
	let best = 0;
	let least = Infinity;
	for (let j = 0; j < cols; j++) {
		let n = 0;
		for (let r = 0; r < 2 * rows; r++) n += a[col(j) + r] ** 2;
		if (n < least) [least, best] = [n, j];
	}
	return v.slice(2 * cols * best, 2 * cols * (best + 1));
}

/** Evaluates the fit at x into out[0], out[1]. */
export function evaluateFit(fit: RationalFit, xv: number, out: Float64Array | number[]): void {
	let nr = 0,
		ni = 0,
		dr = 0,
		di = 0;
	for (let j = 0; j < fit.x.length; j++) {
		const d = xv - fit.x[j];
		if (d === 0) {
			out[0] = fit.f[2 * j];
			out[1] = fit.f[2 * j + 1];
			return;
		}
		const wr = fit.w[2 * j] / d,
			wi = fit.w[2 * j + 1] / d;
		const fr = fit.f[2 * j],
			fi = fit.f[2 * j + 1];
		nr += wr * fr - wi * fi;
		ni += wr * fi + wi * fr;
		dr += wr;
		di += wi;
	}
	const m = dr * dr + di * di;
	out[0] = (nr * dr + ni * di) / m;
	out[1] = (ni * dr - nr * di) / m;
}

/**
 * AAA on samples (x[i], F[i]) with F interleaved re/im. Stops when the largest error is at most
 * `tol` × max|F| or at `maxTerms` support points (never more than half the samples).
 */
export function aaa(
	x: ArrayLike<number>,
	F: ArrayLike<number>,
	tol = 1e-9,
	maxTerms = 30
): RationalFit {
	const n = x.length;
	const limit = Math.max(1, Math.min(maxTerms, Math.floor(n / 2)));
	let scale = 0;
	for (let i = 0; i < n; i++) scale = Math.max(scale, Math.hypot(F[2 * i], F[2 * i + 1]));
	const support: number[] = [];
	const free = new Set(Array.from({ length: n }, (_, i) => i));
	let mr = 0,
		mi = 0;
	for (let i = 0; i < n; i++) {
		mr += F[2 * i] / n;
		mi += F[2 * i + 1] / n;
	}
	const approx = new Float64Array(2 * n);
	for (let i = 0; i < n; i++) [approx[2 * i], approx[2 * i + 1]] = [mr, mi];
	let fit: RationalFit = {
		x: new Float64Array(0),
		f: new Float64Array(0),
		w: new Float64Array(0),
		error: Infinity
	};
	const out = [0, 0];
	for (let m = 1; m <= limit; m++) {
		let worst = -1;
		let at = -1;
		for (const i of free) {
			const e = Math.hypot(F[2 * i] - approx[2 * i], F[2 * i + 1] - approx[2 * i + 1]);
			if (e > worst) [worst, at] = [e, i];
		}
		support.push(at);
		free.delete(at);
		const rows = [...free];
		const loewner = new Float64Array(2 * rows.length * m);
		for (let j = 0; j < m; j++)
			for (let r = 0; r < rows.length; r++) {
				const i = rows[r];
				const d = x[i] - x[support[j]];
				loewner[2 * (j * rows.length + r)] = (F[2 * i] - F[2 * support[j]]) / d;
				loewner[2 * (j * rows.length + r) + 1] = (F[2 * i + 1] - F[2 * support[j] + 1]) / d;
			}
		const w = smallestRightSingularVector(loewner, rows.length, m); // rows ≥ m: m ≤ n/2
		fit = {
			x: Float64Array.from(support, (i) => x[i]),
			f: Float64Array.from(support.flatMap((i) => [F[2 * i], F[2 * i + 1]])),
			w,
			error: 0
		};
		let err = 0;
		for (let i = 0; i < n; i++) {
			evaluateFit(fit, x[i], out);
			approx[2 * i] = out[0];
			approx[2 * i + 1] = out[1];
			const e = Math.hypot(F[2 * i] - out[0], F[2 * i + 1] - out[1]);
			err = Number.isFinite(e) ? Math.max(err, e) : Infinity;
		}
		fit.error = err;
		if (err <= tol * scale) break;
	}
	return fit;
}

/**
 * Dense complex LU with partial pivoting (Doolittle, right-looking; Golub & Van Loan, Matrix
 * Computations 4th ed., Alg. 3.4.1 [GolubVanLoan4]). A matrix of order n is a Float64Array of 2n²
 * numbers, row-major, re/im interleaved; the factorisation overwrites it.
 */

export interface ComplexLu {
	n: number;
	/** L (unit diagonal, below) and U (on and above the diagonal), interleaved re/im. */
	lu: Float64Array;
	/** Row i of the factored matrix is row piv[i] of the original. */
	piv: Int32Array;
	/** False when a pivot was exactly zero (the matrix is singular). */
	ok: boolean;
}

export function complexMatrix(n: number): Float64Array {
	return new Float64Array(2 * n * n);
}

export function luFactor(a: Float64Array, n: number): ComplexLu {
	const piv = new Int32Array(n);
	for (let i = 0; i < n; i++) piv[i] = i;
	let ok = true;
	const row = 2 * n;
	for (let k = 0; k < n; k++) {
		let best = -1;
		let p = k;
		for (let i = k; i < n; i++) {
			const o = i * row + 2 * k;
			const m = Math.abs(a[o]) + Math.abs(a[o + 1]);
			if (m > best) {
				best = m;
				p = i;
			}
		}
		if (p !== k) {
			const ok0 = k * row;
			const op0 = p * row;
			for (let j = 0; j < row; j++) {
				const t = a[ok0 + j];
				a[ok0 + j] = a[op0 + j];
				a[op0 + j] = t;
			}
			const t = piv[k];
			piv[k] = piv[p];
			piv[p] = t;
		}
		const dk = k * row + 2 * k;
		const pr = a[dk];
		const pi = a[dk + 1];
		const pm = pr * pr + pi * pi;
		if (pm === 0) {
			ok = false;
			continue;
		}
		const ir = pr / pm;
		const ii = -pi / pm;
		for (let i = k + 1; i < n; i++) {
			const o = i * row + 2 * k;
			const xr = a[o];
			const xi = a[o + 1];
			const lr = xr * ir - xi * ii;
			const li = xr * ii + xi * ir;
			a[o] = lr;
			a[o + 1] = li;
			if (lr === 0 && li === 0) continue;
			// row i −= l · row k, from column k + 1 on (contiguous: the hot loop)
			const ri = i * row;
			const rk = k * row;
			for (let j = 2 * (k + 1); j < row; j += 2) {
				const ur = a[rk + j];
				const ui = a[rk + j + 1];
				a[ri + j] -= lr * ur - li * ui;
				a[ri + j + 1] -= lr * ui + li * ur;
			}
		}
	}
	return { n, lu: a, piv, ok };
}

/** Solves A x = b for one right-hand side b (interleaved, length 2n); returns x. */
export function luSolve(f: ComplexLu, b: Float64Array): Float64Array {
	const { n, lu, piv } = f;
	const row = 2 * n;
	const x = new Float64Array(2 * n);
	for (let i = 0; i < n; i++) {
		x[2 * i] = b[2 * piv[i]];
		x[2 * i + 1] = b[2 * piv[i] + 1];
	}
	for (let i = 0; i < n; i++) {
		let sr = x[2 * i];
		let si = x[2 * i + 1];
		const ri = i * row;
		for (let j = 0; j < i; j++) {
			const lr = lu[ri + 2 * j];
			const li = lu[ri + 2 * j + 1];
			sr -= lr * x[2 * j] - li * x[2 * j + 1];
			si -= lr * x[2 * j + 1] + li * x[2 * j];
		}
		x[2 * i] = sr;
		x[2 * i + 1] = si;
	}
	for (let i = n - 1; i >= 0; i--) {
		let sr = x[2 * i];
		let si = x[2 * i + 1];
		const ri = i * row;
		for (let j = i + 1; j < n; j++) {
			const ur = lu[ri + 2 * j];
			const ui = lu[ri + 2 * j + 1];
			sr -= ur * x[2 * j] - ui * x[2 * j + 1];
			si -= ur * x[2 * j + 1] + ui * x[2 * j];
		}
		const dr = lu[ri + 2 * i];
		const di = lu[ri + 2 * i + 1];
		const dm = dr * dr + di * di;
		x[2 * i] = (sr * dr + si * di) / dm;
		x[2 * i + 1] = (si * dr - sr * di) / dm;
	}
	return x;
}

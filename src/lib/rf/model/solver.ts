import { complexMatrix, luFactor, luSolve, type ComplexLu } from './complex-lu';
import type { Geometry, Port } from './geometry';
import {
	farPair,
	farPoints,
	nearPair,
	selfPair,
	PAIR_FAR,
	PAIR_NEAR,
	PAIR_SHARED_END,
	PAIR_SHARED_START,
	type SegmentArrays
} from './kernel';
import { C, ETA0, MU0 } from './limits';
import type { LumpedLoad } from './types';

/**
 * Thin-wire method of moments. The electric-field integral equation on the wire axis in
 * mixed-potential form — Pocklington's equation (Balanis, Antenna Theory 4th ed., ch. 8
 * [Balanis4]) with the derivative moved onto the testing function — solved by Galerkin's method
 * with triangle (piecewise-linear) basis and testing functions on straight segments (Harrington,
 * Field Computation by Moment Methods, 1968, ch. 4 [Harrington68]):
 *
 *   Z_mn = jωμ ∫∫ f_m·f_n G dl dl′ + 1/(jωε) ∫∫ (∇·f_m)(∇′·f_n) G dl dl′,   V_m = ⟨f_m, E_inc⟩,
 *
 * time dependence e^{jωt}. A delta-gap feed of 1 V at a node gives V_m = ±1 on the bases through
 * it; the input impedance is 1/I there. A perfect ground plane at z = 0 adds each segment's mirror
 * image with its current reversed (image theory, Balanis ch. 4). Wire loss adds the surface
 * impedance (1 + j)·√(ωμ/2σ)/(2πa) per unit length (Balanis ch. 2, high-frequency resistance);
 * lumped loads add their impedance on the bases through their node.
 */

export interface Complex {
	re: number;
	im: number;
}

export interface Solution {
	f_hz: number;
	geometry: Geometry;
	/** Basis coefficients for 1 V at the feed, interleaved re/im. */
	coefficients: Float64Array;
	/** Input impedance at the feed, Ω. */
	z_in: Complex;
	/** Current at each segment's start and end along the segment (A for 1 V), interleaved re/im. */
	i_start: Float64Array;
	i_end: Float64Array;
	/** Powers for 1 V peak at the feed, W: accepted, lost in the wire, lost in loads. */
	p_in: number;
	p_wire: number;
	p_loads: number;
	timing: { fill_ms: number; lu_ms: number; solve_ms: number };
}

function loadImpedance(l: LumpedLoad, f_hz: number): Complex {
	const w = 2 * Math.PI * f_hz;
	if (l.arrangement === 'series') {
		const x = (l.l_h ?? 0) * w - (l.c_f ? 1 / (w * l.c_f) : 0);
		return { re: l.r_ohm ?? 0, im: x };
	}
	if (l.r_ohm === 0 || l.l_h === 0) return { re: 0, im: 0 };
	const g = l.r_ohm ? 1 / l.r_ohm : 0;
	const b = (l.c_f ?? 0) * w - (l.l_h ? 1 / (w * l.l_h) : 0);
	const d = g * g + b * b;
	return d === 0 ? { re: Infinity, im: 0 } : { re: g / d, im: -b / d };
}

/** Per-unit-length surface impedance of a round wire, Ω/m (skin depth ≪ radius). */
export function wireImpedancePerMetre(f_hz: number, radius: number, sigma: number | null): number {
	if (sigma === null) return 0;
	return Math.sqrt((2 * Math.PI * f_hz * MU0) / (2 * sigma)) / (2 * Math.PI * radius);
}

const J = new Float64Array(8);

function pairKind(g: Geometry, p: number, q: number, image: boolean): number {
	const { node0, node1, grounded } = g;
	const shares = (v: number) => (v === node0[q] || v === node1[q]) && (!image || grounded[v] === 1);
	if (shares(node0[p])) return PAIR_SHARED_START;
	if (shares(node1[p])) return PAIR_SHARED_END;
	return PAIR_FAR;
}

/**
 * The impedance matrix at `f_hz`, order `g.bases`, interleaved re/im, with wire loss and loads.
 */
export function impedanceMatrix(g: Geometry, f_hz: number): Float64Array {
	const S = g.segments;
	const nb = g.bases;
	const z = complexMatrix(nb);
	const k = (2 * Math.PI * f_hz) / C;
	const eta = ETA0;
	const { pieceStart, basisOf, sigma, alpha, beta } = g;
	const row = 2 * nb;

	const assemble = (p: number, q: number, Q: SegmentArrays, sign: number) => {
		const dotu = S.ux[p] * Q.ux[q] + S.uy[p] * Q.uy[q] + S.uz[p] * Q.uz[q];
		const inv = 1 / (k * S.len[p] * S.len[q]);
		for (let i = pieceStart[p]; i < pieceStart[p + 1]; i++) {
			const m = basisOf[i],
				ai = alpha[i],
				bi = beta[i];
			for (let j = pieceStart[q]; j < pieceStart[q + 1]; j++) {
				const n = basisOf[j],
					aj = alpha[j],
					bj = beta[j];
				const ss = sign * sigma[i] * sigma[j];
				const wr = ai * aj * J[0] + ai * bj * J[4] + bi * aj * J[2] + bi * bj * J[6];
				const wi = ai * aj * J[1] + ai * bj * J[5] + bi * aj * J[3] + bi * bj * J[7];
				// j·η·(k (u·u′) w − ββ′ J00 /(k ΔΔ′))
				const tr = k * dotu * wr - bi * bj * inv * J[0];
				const ti = k * dotu * wi - bi * bj * inv * J[1];
				const vr = -eta * ti * ss;
				const vi = eta * tr * ss;
				const o = m * row + 2 * n;
				z[o] += vr;
				z[o + 1] += vi;
				if (p !== q) {
					const o2 = n * row + 2 * m;
					z[o2] += vr;
					z[o2 + 1] += vi;
				}
			}
		}
	};

	const integrate = (p: number, q: number, Q: SegmentArrays, image: boolean) => {
		const a2 = (S.rad[p] * S.rad[p] + Q.rad[q] * Q.rad[q]) / 2;
		let kind = pairKind(g, p, q, image);
		const mean = (S.len[p] + Q.len[q]) / 2;
		const dx = S.sx[p] + (S.len[p] * S.ux[p]) / 2 - Q.sx[q] - (Q.len[q] * Q.ux[q]) / 2;
		const dy = S.sy[p] + (S.len[p] * S.uy[p]) / 2 - Q.sy[q] - (Q.len[q] * Q.uy[q]) / 2;
		const dz = S.sz[p] + (S.len[p] * S.uz[p]) / 2 - Q.sz[q] - (Q.len[q] * Q.uz[q]) / 2;
		const dist = Math.sqrt(dx * dx + dy * dy + dz * dz) / mean;
		if (kind === PAIR_FAR && dist < 1.5) kind = PAIR_NEAR;
		if (kind === PAIR_FAR)
			farPair(J, S, p, Q, q, a2, k, farPoints(dist, k * S.len[p]), farPoints(dist, k * Q.len[q]));
		else nearPair(J, S, p, Q, q, a2, k, kind);
	};

	for (let p = 0; p < S.n; p++) {
		for (let q = p; q < S.n; q++) {
			if (p === q) selfPair(J, S.len[p], S.rad[p], k);
			else integrate(p, q, S, false);
			assemble(p, q, S, 1);
			if (g.images) {
				integrate(p, q, g.images, true);
				assemble(p, q, g.images, -1);
			}
		}
	}

	// Wire loss: Z′·Δ·∫(α_i + β_i t)(α_j + β_j t) dt on each segment.
	if (g.conductivity !== null) {
		for (let p = 0; p < S.n; p++) {
			const zs = wireImpedancePerMetre(f_hz, S.rad[p], g.conductivity) * S.len[p];
			for (let i = pieceStart[p]; i < pieceStart[p + 1]; i++)
				for (let j = pieceStart[p]; j < pieceStart[p + 1]; j++) {
					const ov =
						alpha[i] * alpha[j] +
						(alpha[i] * beta[j] + beta[i] * alpha[j]) / 2 +
						(beta[i] * beta[j]) / 3;
					const v = zs * sigma[i] * sigma[j] * ov;
					const o = basisOf[i] * row + 2 * basisOf[j];
					z[o] += v;
					z[o + 1] += v;
				}
		}
	}
	for (const { port, load } of g.loads) addAtPort(z, nb, port, loadImpedance(load, f_hz));
	return z;
}

function addAtPort(z: Float64Array, nb: number, port: Port, v: Complex): void {
	for (let a = 0; a < port.bases.length; a++)
		for (let b = 0; b < port.bases.length; b++) {
			const o = port.bases[a] * 2 * nb + 2 * port.bases[b];
			const s = port.signs[a] * port.signs[b];
			z[o] += s * v.re;
			z[o + 1] += s * v.im;
		}
}

function excite(nb: number, port: Port): Float64Array {
	const b = new Float64Array(2 * nb);
	for (let a = 0; a < port.bases.length; a++) b[2 * port.bases[a]] = port.signs[a];
	return b;
}

function portCurrent(x: Float64Array, port: Port): Complex {
	let re = 0;
	let im = 0;
	for (let a = 0; a < port.bases.length; a++) {
		re += port.signs[a] * x[2 * port.bases[a]];
		im += port.signs[a] * x[2 * port.bases[a] + 1];
	}
	return { re, im };
}

/** Segment end currents from basis coefficients. */
function segmentCurrents(g: Geometry, x: Float64Array) {
	const n = g.segments.n;
	const i_start = new Float64Array(2 * n);
	const i_end = new Float64Array(2 * n);
	for (let p = 0; p < n; p++)
		for (let i = g.pieceStart[p]; i < g.pieceStart[p + 1]; i++) {
			const m = g.basisOf[i];
			const s0 = g.sigma[i] * g.alpha[i];
			const s1 = g.sigma[i] * (g.alpha[i] + g.beta[i]);
			i_start[2 * p] += s0 * x[2 * m];
			i_start[2 * p + 1] += s0 * x[2 * m + 1];
			i_end[2 * p] += s1 * x[2 * m];
			i_end[2 * p + 1] += s1 * x[2 * m + 1];
		}
	return { i_start, i_end };
}

const now = () => performance.now();

/** Solves the model at one frequency for 1 V at the feed. */
export function solve(g: Geometry, f_hz: number): Solution {
	const t0 = now();
	const z = impedanceMatrix(g, f_hz);
	const t1 = now();
	const lu = luFactor(z, g.bases);
	const t2 = now();
	const x = luSolve(lu, excite(g.bases, g.feed));
	const t3 = now();
	const i = portCurrent(x, g.feed);
	const mag = i.re * i.re + i.im * i.im;
	const { i_start, i_end } = segmentCurrents(g, x);
	let p_wire = 0;
	if (g.conductivity !== null) {
		const S = g.segments;
		for (let p = 0; p < S.n; p++) {
			const ar = i_start[2 * p],
				ai = i_start[2 * p + 1],
				br = i_end[2 * p],
				bi = i_end[2 * p + 1];
			const mean2 = (ar * ar + ai * ai + br * br + bi * bi + ar * br + ai * bi) / 3;
			p_wire += 0.5 * wireImpedancePerMetre(f_hz, S.rad[p], g.conductivity) * S.len[p] * mean2;
		}
	}
	let p_loads = 0;
	for (const { port, load } of g.loads) {
		const il = portCurrent(x, port);
		p_loads += 0.5 * loadImpedance(load, f_hz).re * (il.re * il.re + il.im * il.im);
	}
	return {
		f_hz,
		geometry: g,
		coefficients: x,
		z_in: { re: i.re / mag, im: -i.im / mag },
		i_start,
		i_end,
		p_in: 0.5 * i.re,
		p_wire,
		p_loads,
		timing: { fill_ms: t1 - t0, lu_ms: t2 - t1, solve_ms: t3 - t2 }
	};
}

/**
 * The n-port impedance matrix seen at `ports` (each a delta gap; the model's own feed is not
 * driven unless listed): solves with 1 V at each port in turn, the others shorted, giving the
 * admittance matrix Y, and returns Z = Y⁻¹ (interleaved, row-major).
 */
export function solvePorts(g: Geometry, ports: Port[], f_hz: number): Float64Array {
	const n = ports.length;
	const lu: ComplexLu = luFactor(impedanceMatrix(g, f_hz), g.bases);
	const y = complexMatrix(n);
	for (let b = 0; b < n; b++) {
		const x = luSolve(lu, excite(g.bases, ports[b]));
		for (let a = 0; a < n; a++) {
			const c = portCurrent(x, ports[a]);
			y[a * 2 * n + 2 * b] = c.re;
			y[a * 2 * n + 2 * b + 1] = c.im;
		}
	}
	const yl = luFactor(y, n);
	const out = complexMatrix(n);
	for (let b = 0; b < n; b++) {
		const e = new Float64Array(2 * n);
		e[2 * b] = 1;
		const col = luSolve(yl, e);
		for (let a = 0; a < n; a++) {
			out[a * 2 * n + 2 * b] = col[2 * a];
			out[a * 2 * n + 2 * b + 1] = col[2 * a + 1];
		}
	}
	return out;
}

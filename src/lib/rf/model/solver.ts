import { complexMatrix, luFactor, luSolve, type ComplexLu } from './complex-lu';
import { impedanceMatrix, loadImpedance, wireImpedancePerMetre } from './fill';
import type { Geometry, Port } from './geometry';
import type { Complex } from './types';

export type { Complex };
export { impedanceMatrix };

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

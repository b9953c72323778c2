import { complexMatrix } from './complex-lu';
import type { Geometry, Port } from './geometry';
import {
	farDistances,
	farFromDistances,
	farPoints,
	nearPair,
	selfPair,
	PAIR_FAR,
	PAIR_NEAR,
	PAIR_SELF,
	PAIR_SHARED_END,
	PAIR_SHARED_START,
	type SegmentArrays
} from './kernel';
import { C, ETA0, MU0 } from './limits';
import type { Complex, LumpedLoad } from './types';

/**
 * The impedance matrix of solver.ts, filled segment pair by segment pair (p ≤ q, then mirrored:
 * the Galerkin matrix is symmetric), images included. How each pair is integrated, and the
 * distances of far pairs, depend only on the geometry: they are worked out once per geometry (at
 * its top frequency, the most points) and kept while the geometry lives, so a sweep pays for
 * them once.
 */

interface FillPlan {
	/** Far pairs: segments, image flag, points per segment, offset of their distances in `r`. */
	far: {
		p: Int32Array;
		q: Int32Array;
		image: Uint8Array;
		np: Uint8Array;
		nq: Uint8Array;
		off: Int32Array;
		r: Float64Array;
	};
	/** Other pairs (self, sharing a node, close): integrated afresh at every frequency. */
	near: { p: Int32Array; q: Int32Array; image: Uint8Array; kind: Uint8Array };
}

const plans = new WeakMap<Geometry, FillPlan>();

function pairKind(g: Geometry, p: number, q: number, Q: SegmentArrays, image: boolean): number {
	const S = g.segments;
	if (!image && p === q) return PAIR_SELF;
	const { node0, node1, grounded } = g;
	const shares = (v: number) => (v === node0[q] || v === node1[q]) && (!image || grounded[v] === 1);
	if (shares(node0[p])) return PAIR_SHARED_START;
	if (shares(node1[p])) return PAIR_SHARED_END;
	return centreDistance(S, p, Q, q) < 1.5 ? PAIR_NEAR : PAIR_FAR;
}

/** Distance between segment centres in mean segment lengths. */
function centreDistance(S: SegmentArrays, p: number, Q: SegmentArrays, q: number): number {
	const dx = S.sx[p] + (S.len[p] * S.ux[p]) / 2 - Q.sx[q] - (Q.len[q] * Q.ux[q]) / 2;
	const dy = S.sy[p] + (S.len[p] * S.uy[p]) / 2 - Q.sy[q] - (Q.len[q] * Q.uy[q]) / 2;
	const dz = S.sz[p] + (S.len[p] * S.uz[p]) / 2 - Q.sz[q] - (Q.len[q] * Q.uz[q]) / 2;
	return (2 * Math.sqrt(dx * dx + dy * dy + dz * dz)) / (S.len[p] + Q.len[q]);
}

const radius2 = (S: SegmentArrays, p: number, Q: SegmentArrays, q: number) =>
	(S.rad[p] * S.rad[p] + Q.rad[q] * Q.rad[q]) / 2;

function planFor(g: Geometry): FillPlan {
	const hit = plans.get(g);
	if (hit) return hit;
	const S = g.segments;
	const kTop = (2 * Math.PI * g.top_hz) / C;
	const far: number[][] = [[], [], [], [], []];
	const near: number[][] = [[], [], [], []];
	let points = 0;
	for (const [Q, image] of g.images
		? ([
				[S, 0],
				[g.images, 1]
			] as const)
		: ([[S, 0]] as const))
		for (let p = 0; p < S.n; p++)
			for (let q = p; q < S.n; q++) {
				const kind = pairKind(g, p, q, Q, image === 1);
				if (kind !== PAIR_FAR) {
					near[0].push(p);
					near[1].push(q);
					near[2].push(image);
					near[3].push(kind);
					continue;
				}
				const d = centreDistance(S, p, Q, q);
				const np = farPoints(d, kTop * S.len[p]);
				const nq = farPoints(d, kTop * Q.len[q]);
				far[0].push(p);
				far[1].push(q);
				far[2].push(image);
				far[3].push(np);
				far[4].push(nq);
				points += np * nq;
			}
	const n = far[0].length;
	const plan: FillPlan = {
		far: {
			p: Int32Array.from(far[0]),
			q: Int32Array.from(far[1]),
			image: Uint8Array.from(far[2]),
			np: Uint8Array.from(far[3]),
			nq: Uint8Array.from(far[4]),
			off: new Int32Array(n),
			r: new Float64Array(points)
		},
		near: {
			p: Int32Array.from(near[0]),
			q: Int32Array.from(near[1]),
			image: Uint8Array.from(near[2]),
			kind: Uint8Array.from(near[3])
		}
	};
	let off = 0;
	for (let i = 0; i < n; i++) {
		const p = plan.far.p[i],
			q = plan.far.q[i];
		const Q = plan.far.image[i] ? g.images! : S;
		plan.far.off[i] = off;
		farDistances(plan.far.r, off, S, p, Q, q, radius2(S, p, Q, q), plan.far.np[i], plan.far.nq[i]);
		off += plan.far.np[i] * plan.far.nq[i];
	}
	plans.set(g, plan);
	return plan;
}

export function loadImpedance(l: LumpedLoad, f_hz: number): Complex {
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

/** Real part of a round wire's surface impedance per unit length, Ω/m (skin depth ≪ radius); the imaginary part is equal. */
export function wireImpedancePerMetre(f_hz: number, radius: number, sigma: number | null): number {
	if (sigma === null) return 0;
	return Math.sqrt((2 * Math.PI * f_hz * MU0) / (2 * sigma)) / (2 * Math.PI * radius);
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

const J = new Float64Array(8);

/** The impedance matrix at `f_hz`, order `g.bases`, interleaved re/im, with wire loss and loads. */
export function impedanceMatrix(g: Geometry, f_hz: number): Float64Array {
	const S = g.segments;
	const nb = g.bases;
	const z = complexMatrix(nb);
	const k = (2 * Math.PI * f_hz) / C;
	const { pieceStart, basisOf, sigma, alpha, beta } = g;
	const row = 2 * nb;
	const plan = planFor(g);

	/** Adds J (pair p, q; source set Q; sign −1 for images) to every basis pair on the two segments. */
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
				const vr = -ETA0 * (k * dotu * wi - bi * bj * inv * J[1]) * ss;
				const vi = ETA0 * (k * dotu * wr - bi * bj * inv * J[0]) * ss;
				z[m * row + 2 * n] += vr;
				z[m * row + 2 * n + 1] += vi;
				if (p !== q) {
					z[n * row + 2 * m] += vr;
					z[n * row + 2 * m + 1] += vi;
				}
			}
		}
	};

	const { far, near } = plan;
	for (let i = 0; i < far.p.length; i++) {
		const p = far.p[i],
			q = far.q[i];
		const Q = far.image[i] ? g.images! : S;
		farFromDistances(J, far.r, far.off[i], far.np[i], far.nq[i], S.len[p], Q.len[q], k);
		assemble(p, q, Q, far.image[i] ? -1 : 1);
	}
	for (let i = 0; i < near.p.length; i++) {
		const p = near.p[i],
			q = near.q[i];
		const Q = near.image[i] ? g.images! : S;
		if (near.kind[i] === PAIR_SELF) selfPair(J, S.len[p], S.rad[p], k);
		else nearPair(J, S, p, Q, q, radius2(S, p, Q, q), k, near.kind[i]);
		assemble(p, q, Q, near.image[i] ? -1 : 1);
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
					z[basisOf[i] * row + 2 * basisOf[j]] += v;
					z[basisOf[i] * row + 2 * basisOf[j] + 1] += v;
				}
		}
	}
	for (const { port, load } of g.loads) addAtPort(z, nb, port, loadImpedance(load, f_hz));
	return z;
}

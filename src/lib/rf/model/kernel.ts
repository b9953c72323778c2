import { gaussLegendre, gradedRule, type Rule } from './quadrature';

/**
 * Reaction integrals between two straight segments with the reduced thin-wire kernel
 * G(R) = e^{−jkR}/(4πR), R = √(|r − r′|² + a²) (source current on the wire axis seen from the
 * wire surface; Balanis, Antenna Theory 4th ed., ch. 8, [Balanis4]):
 *
 *   J_ab = ∫₀¹∫₀¹ w_a(t) w_b(t′) G(R) Δp Δq dt dt′,  w_0 = 1, w_1 = t,
 *
 * t running along the observing segment p and t′ along the source segment q. Far pairs use a
 * Gauss product rule. Near pairs split G into 1/(4πR) and the smooth (e^{−jkR} − 1)/(4πR): the
 * first is integrated along the source in closed form, ∫ds′/R = asinh, ∫s′ds′/R = R; the outer
 * integral is Gauss, graded towards a shared end. The self pair is reduced to one dimension in
 * u = s − s′ and its static part is closed form (∫uⁿ/√(u²+a²) du, n = 0…3).
 */

export interface SegmentArrays {
	n: number;
	sx: Float64Array;
	sy: Float64Array;
	sz: Float64Array;
	ux: Float64Array;
	uy: Float64Array;
	uz: Float64Array;
	len: Float64Array;
	rad: Float64Array;
}

/** How a pair is integrated (see `classifyPair`). */
export const PAIR_FAR = 0;
export const PAIR_NEAR = 1;
export const PAIR_SHARED_START = 2;
export const PAIR_SHARED_END = 3;
export const PAIR_SELF = 4;

const FOUR_PI = 4 * Math.PI;
const NEAR_PANEL = gaussLegendre(8);
const NEAR_INNER = gaussLegendre(4);
const SELF_RULE = gaussLegendre(10);

/** Adds one outer point (weight w at t) with inner integrals S0 = ∫G, S1 = ∫t′G to J00, J10, J01, J11. */
function addOuter(
	out: Float64Array,
	w: number,
	t: number,
	s0r: number,
	s0i: number,
	s1r: number,
	s1i: number
): void {
	out[0] += w * s0r;
	out[1] += w * s0i;
	out[2] += w * t * s0r;
	out[3] += w * t * s0i;
	out[4] += w * s1r;
	out[5] += w * s1i;
	out[6] += w * t * s1r;
	out[7] += w * t * s1i;
}

/** Gauss points per segment for a far pair at centre distance `dist` (in mean segment lengths). */
export function farPoints(dist: number, kLen: number): number {
	const n = dist < 3 ? 5 : dist < 8 ? 3 : 2;
	return Math.max(n, Math.min(12, Math.ceil(kLen) + 1));
}

/**
 * Far pair, first half: the reduced-kernel distances R between the `np` Gauss points on p and the
 * `nq` on q, written to r[off…off + np·nq) (frequency-independent, so a sweep computes them once).
 */
export function farDistances(
	r: Float64Array,
	off: number,
	P: SegmentArrays,
	p: number,
	Q: SegmentArrays,
	q: number,
	a2: number,
	np: number,
	nq: number
): void {
	const rp = gaussLegendre(np);
	const rq = gaussLegendre(nq);
	const lp = P.len[p];
	const lq = Q.len[q];
	for (let i = 0; i < np; i++) {
		const x = P.sx[p] + rp.t[i] * lp * P.ux[p];
		const y = P.sy[p] + rp.t[i] * lp * P.uy[p];
		const z = P.sz[p] + rp.t[i] * lp * P.uz[p];
		for (let j = 0; j < nq; j++) {
			const dx = x - (Q.sx[q] + rq.t[j] * lq * Q.ux[q]);
			const dy = y - (Q.sy[q] + rq.t[j] * lq * Q.uy[q]);
			const dz = z - (Q.sz[q] + rq.t[j] * lq * Q.uz[q]);
			r[off + i * nq + j] = Math.sqrt(dx * dx + dy * dy + dz * dz + a2);
		}
	}
}

/** Far pair, second half: [J00, J10, J01, J11] (re/im, divided by 4π) from the distances at wavenumber k. */
export function farFromDistances(
	out: Float64Array,
	r: Float64Array,
	off: number,
	np: number,
	nq: number,
	lp: number,
	lq: number,
	k: number
): void {
	const rp = gaussLegendre(np);
	const rq = gaussLegendre(nq);
	out.fill(0);
	for (let i = 0; i < np; i++) {
		let s0r = 0,
			s0i = 0,
			s1r = 0,
			s1i = 0;
		for (let j = 0; j < nq; j++) {
			const d = r[off + i * nq + j];
			const w = rq.w[j] / d;
			const gr = Math.cos(k * d) * w;
			const gi = -Math.sin(k * d) * w;
			s0r += gr;
			s0i += gi;
			s1r += rq.t[j] * gr;
			s1i += rq.t[j] * gi;
		}
		addOuter(out, rp.w[i], rp.t[i], s0r, s0i, s1r, s1i);
	}
	for (let i = 0; i < 8; i++) out[i] *= (lp * lq) / FOUR_PI;
}

/** Far pair in one call: Gauss product rule with `np` × `nq` points. */
export function farPair(
	out: Float64Array,
	P: SegmentArrays,
	p: number,
	Q: SegmentArrays,
	q: number,
	a2: number,
	k: number,
	np: number,
	nq: number
): void {
	const r = new Float64Array(np * nq);
	farDistances(r, 0, P, p, Q, q, a2, np, nq);
	farFromDistances(out, r, 0, np, nq, P.len[p], Q.len[q], k);
}

const gradedCache = new Map<number, Rule>();
function graded(ratio: number): Rule {
	// one rule per power of two of radius/length keeps the cache small
	const e = Math.max(-60, Math.floor(Math.log2(Math.max(ratio, 1e-18))));
	let r = gradedCache.get(e);
	if (!r) gradedCache.set(e, (r = gradedRule(Math.pow(2, e) / 4)));
	return r;
}

/**
 * Outer rule along p for a near pair: Gauss panels split where q's end points project onto p,
 * since the inner integral changes character there.
 */
function splitAtEnds(P: SegmentArrays, p: number, Q: SegmentArrays, q: number): Rule {
	const cuts = [0, 1];
	for (const s of [0, Q.len[q]]) {
		const t =
			((Q.sx[q] + s * Q.ux[q] - P.sx[p]) * P.ux[p] +
				(Q.sy[q] + s * Q.uy[q] - P.sy[p]) * P.uy[p] +
				(Q.sz[q] + s * Q.uz[q] - P.sz[p]) * P.uz[p]) /
			P.len[p];
		if (t > 0.02 && t < 0.98) cuts.push(t);
	}
	cuts.sort((x, y) => x - y);
	const n = NEAR_PANEL.t.length;
	const t = new Float64Array(n * (cuts.length - 1));
	const w = new Float64Array(t.length);
	for (let c = 0; c + 1 < cuts.length; c++)
		for (let i = 0; i < n; i++) {
			t[c * n + i] = cuts[c] + (cuts[c + 1] - cuts[c]) * NEAR_PANEL.t[i];
			w[c * n + i] = (cuts[c + 1] - cuts[c]) * NEAR_PANEL.w[i];
		}
	return { t, w };
}

/**
 * Near pair: outer Gauss along p (graded towards its start or end when the pair shares that
 * node), inner integral along q with the static part in closed form.
 */
export function nearPair(
	out: Float64Array,
	P: SegmentArrays,
	p: number,
	Q: SegmentArrays,
	q: number,
	a2: number,
	k: number,
	kind: number
): void {
	const lp = P.len[p];
	const lq = Q.len[q];
	const a = Math.sqrt(a2);
	const outer = kind === PAIR_NEAR ? splitAtEnds(P, p, Q, q) : graded(a / lp);
	const flip = kind === PAIR_SHARED_END;
	const qx = Q.sx[q],
		qy = Q.sy[q],
		qz = Q.sz[q];
	const vx = Q.ux[q],
		vy = Q.uy[q],
		vz = Q.uz[q];
	out.fill(0);
	for (let i = 0; i < outer.t.length; i++) {
		const ti = flip ? 1 - outer.t[i] : outer.t[i];
		const dx = P.sx[p] + ti * lp * P.ux[p] - qx;
		const dy = P.sy[p] + ti * lp * P.uy[p] - qy;
		const dz = P.sz[p] + ti * lp * P.uz[p] - qz;
		const s0 = dx * vx + dy * vy + dz * vz;
		const cx = dy * vz - dz * vy;
		const cy = dz * vx - dx * vz;
		const cz = dx * vy - dy * vx;
		const rho2 = cx * cx + cy * cy + cz * cz + a2;
		const rho = Math.sqrt(rho2);
		const A0 = Math.asinh((lq - s0) / rho) + Math.asinh(s0 / rho);
		const rEnd = Math.sqrt(rho2 + (lq - s0) * (lq - s0));
		const rStart = Math.sqrt(rho2 + s0 * s0);
		let s0r = A0;
		let s0i = 0;
		let s1r = (rEnd - rStart + s0 * A0) / lq;
		let s1i = 0;
		for (let j = 0; j < NEAR_INNER.t.length; j++) {
			const tj = NEAR_INNER.t[j];
			const ds = tj * lq - s0;
			const r = Math.sqrt(rho2 + ds * ds);
			const h = Math.sin((k * r) / 2);
			const w = (NEAR_INNER.w[j] * lq) / r;
			const gr = -2 * h * h * w;
			const gi = -Math.sin(k * r) * w;
			s0r += gr;
			s0i += gi;
			s1r += tj * gr;
			s1i += tj * gi;
		}
		addOuter(out, outer.w[i], ti, s0r, s0i, s1r, s1i);
	}
	for (let i = 0; i < 8; i++) out[i] *= lp / FOUR_PI;
}

/**
 * Self pair of a segment of length Δ and radius a. With u = s − s′ every integral is
 * 2∫₀^Δ K(u) M(u) du with M = Δ − u for weight 1·1 and M = (Δ³ − u³)/3 − u(Δ² − u²)/2 for s·s′;
 * weights s·1 and 1·s′ give Δ/2 times the first by symmetry.
 */
export function selfPair(out: Float64Array, len: number, a: number, k: number): void {
	const d = len;
	const a2 = a * a;
	const rd = Math.sqrt(d * d + a2);
	const n0 = Math.asinh(d / a);
	const n1 = rd - a;
	const n3 = (rd * rd * rd - a2 * a) / 3 - a2 * (rd - a);
	let p00r = 2 * (d * n0 - n1);
	let p11r = 2 * ((d * d * d * n0) / 3 - (d * d * n1) / 2 + n3 / 6);
	let p00i = 0;
	let p11i = 0;
	for (let j = 0; j < SELF_RULE.t.length; j++) {
		const u = SELF_RULE.t[j] * d;
		const r = Math.sqrt(u * u + a2);
		const h = Math.sin((k * r) / 2);
		const w = (2 * SELF_RULE.w[j] * d) / r;
		const gr = -2 * h * h * w;
		const gi = -Math.sin(k * r) * w;
		const m0 = d - u;
		const m1 = (d * d * d - u * u * u) / 3 - (u * (d * d - u * u)) / 2;
		p00r += gr * m0;
		p00i += gi * m0;
		p11r += gr * m1;
		p11i += gi * m1;
	}
	const f = 1 / FOUR_PI;
	out[0] = p00r * f;
	out[1] = p00i * f;
	out[2] = out[4] = (p00r * f) / 2;
	out[3] = out[5] = (p00i * f) / 2;
	out[6] = (p11r * f) / (d * d);
	out[7] = (p11i * f) / (d * d);
}

import { describe, expect, it } from 'vitest';
import {
	farPair,
	nearPair,
	selfPair,
	PAIR_NEAR,
	PAIR_SHARED_END,
	PAIR_SHARED_START,
	type SegmentArrays
} from './kernel';

type V = [number, number, number];

function segments(list: [V, V, number][]): SegmentArrays {
	const n = list.length;
	const f = () => new Float64Array(n);
	const s: SegmentArrays = {
		n,
		sx: f(),
		sy: f(),
		sz: f(),
		ux: f(),
		uy: f(),
		uz: f(),
		len: f(),
		rad: f()
	};
	list.forEach(([a, b, r], i) => {
		const l = Math.hypot(b[0] - a[0], b[1] - a[1], b[2] - a[2]);
		[s.sx[i], s.sy[i], s.sz[i]] = a;
		[s.ux[i], s.uy[i], s.uz[i]] = [(b[0] - a[0]) / l, (b[1] - a[1]) / l, (b[2] - a[2]) / l];
		s.len[i] = l;
		s.rad[i] = r;
	});
	return s;
}

/**
 * The four reaction integrals by brute force: composite 4-point Gauss on `panels` equal panels
 * along each segment (the test's own rule, fine enough to resolve the radius).
 */
function bruteForce(
	S: SegmentArrays,
	p: number,
	q: number,
	a2: number,
	k: number,
	panels: number
): number[] {
	const g = [0.0694318442029737, 0.3300094782075719, 0.6699905217924281, 0.9305681557970263];
	const w = [0.1739274225687269, 0.3260725774312731, 0.3260725774312731, 0.1739274225687269];
	const pts: [number, number][] = [];
	for (let m = 0; m < panels; m++)
		for (let i = 0; i < 4; i++) pts.push([(m + g[i]) / panels, w[i] / panels]);
	const out = [0, 0, 0, 0, 0, 0, 0, 0];
	for (const [t, wt] of pts) {
		const x = S.sx[p] + t * S.len[p] * S.ux[p],
			y = S.sy[p] + t * S.len[p] * S.uy[p],
			z = S.sz[p] + t * S.len[p] * S.uz[p];
		for (const [u, wu] of pts) {
			const r = Math.sqrt(
				(x - S.sx[q] - u * S.len[q] * S.ux[q]) ** 2 +
					(y - S.sy[q] - u * S.len[q] * S.uy[q]) ** 2 +
					(z - S.sz[q] - u * S.len[q] * S.uz[q]) ** 2 +
					a2
			);
			const c = (wt * wu * S.len[p] * S.len[q]) / (4 * Math.PI * r);
			const gr = c * Math.cos(k * r),
				gi = -c * Math.sin(k * r);
			out[0] += gr;
			out[1] += gi;
			out[2] += t * gr;
			out[3] += t * gi;
			out[4] += u * gr;
			out[5] += u * gi;
			out[6] += t * u * gr;
			out[7] += t * u * gi;
		}
	}
	return out;
}

const close = (got: Float64Array, want: number[], rel: number) => {
	const scale = Math.hypot(want[0], want[1]);
	for (let i = 0; i < 8; i++) expect(Math.abs(got[i] - want[i]) / scale).toBeLessThan(rel);
};

describe('reaction integrals with the reduced kernel', () => {
	const d = 0.05; // segment length, m
	const a = 0.0025; // radius: d/20
	const k = (2 * Math.PI) / 1; // λ = 1 m, kΔ = 0.31 (the default λ/20 segments)

	it('self pair, static part: 2[Δ·asinh(Δ/a) − √(Δ²+a²) + a]/(4π) [calc: ∫∫(x−y)² + a²)^−½ by antiderivatives]', () => {
		const out = new Float64Array(8);
		selfPair(out, d, a, 1e-12);
		// G2(u) = u·asinh(u/a) − √(u²+a²) has G2″ = 1/√(u²+a²); ∫₀^Δ∫₀^Δ = G2(Δ) − 2G2(0) + G2(−Δ)
		const g2 = (u: number) => u * Math.asinh(u / a) - Math.sqrt(u * u + a * a);
		expect(out[0]).toBeCloseTo((g2(d) - 2 * g2(0) + g2(-d)) / (4 * Math.PI), 12);
	});

	it('self pair against brute force', () => {
		const S = segments([[[0, 0, 0], [0, 0, d], a]]);
		const out = new Float64Array(8);
		selfPair(out, d, a, k);
		close(out, bruteForce(S, 0, 0, a * a, k, 300), 2e-5);
	});

	it('collinear neighbours sharing a node, either order', () => {
		const S = segments([
			[[0, 0, 0], [0, 0, d], a],
			[[0, 0, d], [0, 0, 2 * d], a]
		]);
		const out = new Float64Array(8);
		nearPair(out, S, 0, S, 1, a * a, k, PAIR_SHARED_END);
		close(out, bruteForce(S, 0, 1, a * a, k, 300), 1e-5);
		nearPair(out, S, 1, S, 0, a * a, k, PAIR_SHARED_START);
		close(out, bruteForce(S, 1, 0, a * a, k, 300), 1e-5);
	});

	it('a bend of 60° at a shared node', () => {
		const S = segments([
			[[0, 0, 0], [0, 0, d], a],
			[[0, 0, d], [d * Math.sin(Math.PI / 3), 0, d + d * Math.cos(Math.PI / 3)], a]
		]);
		const out = new Float64Array(8);
		nearPair(out, S, 0, S, 1, a * a, k, PAIR_SHARED_END);
		close(out, bruteForce(S, 0, 1, a * a, k, 300), 1e-5);
	});

	it('parallel wires four radii apart (near, no shared node)', () => {
		const S = segments([
			[[0, 0, 0], [0, 0, d], a],
			[[4 * a, 0, 0.2 * d], [4 * a, 0, 1.2 * d], a]
		]);
		const out = new Float64Array(8);
		nearPair(out, S, 0, S, 1, a * a, k, PAIR_NEAR);
		close(out, bruteForce(S, 0, 1, a * a, k, 100), 1e-4);
	});

	it('a far pair with 2 and 3 points per segment', () => {
		const S = segments([
			[[0, 0, 0], [0, 0, d], a],
			[[0.3, 0.1, 0.05], [0.3, 0.14, 0.08], a]
		]);
		const out = new Float64Array(8);
		const want = bruteForce(S, 0, 1, a * a, k, 10);
		farPair(out, S, 0, S, 1, a * a, k, 2, 2);
		close(out, want, 1e-4);
		farPair(out, S, 0, S, 1, a * a, k, 3, 3);
		close(out, want, 1e-6);
	});

	it('near pairs are reciprocal: J10(p, q) = J01(q, p) to 1e-6', () => {
		const S = segments([
			[[0, 0, 0], [0, 0.01, d], a],
			[[3 * a, 0, 0.3 * d], [3 * a, 0.02, 1.1 * d], 0.5 * a]
		]);
		const pq = new Float64Array(8);
		const qp = new Float64Array(8);
		const a2 = (a * a + 0.25 * a * a) / 2;
		nearPair(pq, S, 0, S, 1, a2, k, PAIR_NEAR);
		nearPair(qp, S, 1, S, 0, a2, k, PAIR_NEAR);
		const scale = Math.hypot(pq[0], pq[1]);
		for (const [i, j] of [
			[0, 0],
			[2, 4],
			[4, 2],
			[6, 6]
		])
			for (const c of [0, 1]) expect(Math.abs(pq[i + c] - qp[j + c]) / scale).toBeLessThan(1e-6);
	});
});

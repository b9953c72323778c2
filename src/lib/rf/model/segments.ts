import type { ExpandedItem, Piece } from './generators';
import type { SegmentArrays } from './kernel';
import { C, MIN_SEGMENT_RADII, SEGMENTS_PER_WAVELENGTH } from './limits';
import type { Vec3 } from './types';

/** Cutting straight pieces into segments: where points fall, how many segments, shared nodes. */

export interface PointOnPiece {
	piece: number;
	local: number;
}

export function pieceLength(p: Piece): number {
	return Math.hypot(p.to[0] - p.from[0], p.to[1] - p.from[1], p.to[2] - p.from[2]);
}

/** The piece and position along it for a 0…1 position along a whole item. */
export function locate(exp: ExpandedItem, first: number, position: number): PointOnPiece {
	const lens = exp.pieces.map(pieceLength);
	const total = lens.reduce((a, b) => a + b, 0);
	let s = position * total;
	for (let i = 0; i < lens.length; i++) {
		if (s <= lens[i] * (1 + 1e-12) || i === lens.length - 1)
			return { piece: first + i, local: Math.min(1, Math.max(0, s / lens[i])) };
		s -= lens[i];
	}
	return { piece: first, local: 0 };
}

/** Default segments: ≤ λ/20 at `top_hz` and ≥ 4 radii, then the fewest more that put every listed point on a node. */
export function defaultSegments(
	len: number,
	radius: number,
	top_hz: number,
	locals: number[]
): number {
	let n = Math.max(1, Math.ceil(len / (C / top_hz / SEGMENTS_PER_WAVELENGTH) - 1e-9));
	if (len / n < MIN_SEGMENT_RADII * radius)
		n = Math.max(1, Math.floor(len / (MIN_SEGMENT_RADII * radius)));
	const interior = locals.some((q) => q > 1e-9 && q < 1 - 1e-9);
	if (interior) n = Math.max(n, 2);
	for (let m = n; m <= 2 * n + 2; m++) {
		const fits = locals.every((q) => {
			const j = Math.round(q * m);
			const inside = q <= 1e-9 || q >= 1 - 1e-9 || (j >= 1 && j <= m - 1);
			return inside && Math.abs(q * m - j) < 1e-6;
		});
		if (fits) return m;
	}
	return n;
}

export function segmentArrays(n: number): SegmentArrays {
	const f = () => new Float64Array(n);
	return { n, sx: f(), sy: f(), sz: f(), ux: f(), uy: f(), uz: f(), len: f(), rad: f() };
}

export function mirror(s: SegmentArrays): SegmentArrays {
	const m = segmentArrays(s.n);
	m.sx.set(s.sx);
	m.sy.set(s.sy);
	m.ux.set(s.ux);
	m.uy.set(s.uy);
	m.len.set(s.len);
	m.rad.set(s.rad);
	for (let i = 0; i < s.n; i++) {
		m.sz[i] = -s.sz[i];
		m.uz[i] = -s.uz[i];
	}
	return m;
}

/** Merge piece end points closer than `tol` into nodes; returns the node of each end (2 per piece). */
export function mergeEnds(pieces: Piece[], tol: number): { ends: Int32Array; points: Vec3[] } {
	const ends = new Int32Array(2 * pieces.length).fill(-1);
	const pts = pieces.flatMap((p) => [p.from, p.to]);
	const order = pts.map((_, i) => i).sort((a, b) => pts[a][0] - pts[b][0]);
	const points: Vec3[] = [];
	for (let oi = 0; oi < order.length; oi++) {
		const i = order[oi];
		if (ends[i] >= 0) continue;
		ends[i] = points.length;
		for (let oj = oi + 1; oj < order.length && pts[order[oj]][0] - pts[i][0] <= tol; oj++) {
			const j = order[oj];
			if (
				ends[j] < 0 &&
				Math.hypot(pts[j][0] - pts[i][0], pts[j][1] - pts[i][1], pts[j][2] - pts[i][2]) <= tol
			)
				ends[j] = points.length;
		}
		points.push(pts[i]);
	}
	return { ends, points };
}

import { MAX_WIRES } from './limits';
import type { ArcWire, HelixWire, ModelItem, Plane, PlateWire, Vec3 } from './types';

/**
 * Arcs, helices and plates as straight pieces. Consecutive pieces share their end points as the
 * same numbers, so the discretiser joins them exactly; a closed arc ends on its first point.
 */

/** One straight piece of wire after expansion. */
export interface Piece {
	from: Vec3;
	to: Vec3;
	radius: number;
	segments?: number;
	/** Index of the model item it came from, and its number within that item. */
	item: number;
	piece: number;
}

/** Pieces of one item in order; `path` is true when they run end to end (wire, arc, helix). */
export interface ExpandedItem {
	pieces: Piece[];
	path: boolean;
}

const DEG = Math.PI / 180;
const AXES: Record<Plane, [number, number, number]> = {
	xy: [0, 1, 2],
	yz: [1, 2, 0],
	zx: [2, 0, 1]
};
const HELIX_AXES = { z: AXES.xy, x: AXES.yz, y: AXES.zx } as const;

/** A point at (u, v, w) in the frame whose axes are the model axes numbered by `ax`. */
function inFrame(
	origin: Vec3,
	ax: [number, number, number],
	u: number,
	v: number,
	w: number
): Vec3 {
	const p: Vec3 = [origin[0], origin[1], origin[2]];
	p[ax[0]] += u;
	p[ax[1]] += v;
	p[ax[2]] += w;
	return p;
}

/** The point at angle φ on a circle of radius r about `origin` in the frame `ax`, w along its normal. */
function circlePoint(
	origin: Vec3,
	ax: [number, number, number],
	r: number,
	phi: number,
	w = 0
): Vec3 {
	return inFrame(origin, ax, r * Math.cos(phi), r * Math.sin(phi), w);
}

function chain(points: Vec3[], radius: number, item: number): Piece[] {
	const out: Piece[] = [];
	for (let i = 0; i + 1 < points.length; i++)
		out.push({ from: points[i], to: points[i + 1], radius, item, piece: out.length });
	return out;
}

/** How many pieces an item expands into, computed without building them (for the cap). */
export function pieceCount(it: ModelItem): number {
	switch (it.kind) {
		case 'wire':
			return 1;
		case 'arc':
			return Math.round(it.pieces);
		case 'helix':
			return Math.max(1, Math.round(it.turns * it.pieces_per_turn));
		case 'plate':
			return it.shape === 'rectangle' ? rectangleCounts(it).pieces : discRings(it).pieces;
	}
}

export function arcPoints(a: ArcWire): Vec3[] {
	const n = Math.round(a.pieces);
	const span = a.end_deg - a.start_deg;
	const closed = Math.abs(Math.abs(span) - 360) < 1e-9;
	const pts: Vec3[] = [];
	for (let i = 0; i <= n; i++) {
		if (closed && i === n) {
			pts.push(pts[0]);
			break;
		}
		const phi = (a.start_deg + (span * i) / n) * DEG;
		pts.push(circlePoint(a.centre, AXES[a.plane], a.arc_radius, phi));
	}
	return pts;
}

export function helixPoints(h: HelixWire): Vec3[] {
	const n = pieceCount(h);
	const hand = h.hand === 'left' ? -1 : 1;
	const start = (h.start_deg ?? 0) * DEG;
	const pts: Vec3[] = [];
	for (let i = 0; i <= n; i++) {
		const turn = (h.turns * i) / n;
		const phi = start + hand * 2 * Math.PI * turn;
		pts.push(circlePoint(h.base, HELIX_AXES[h.axis], h.helix_radius, phi, h.pitch * turn));
	}
	return pts;
}

function rectangleCounts(p: PlateWire) {
	const nu = Math.max(1, Math.ceil((p.width ?? 0) / p.mesh - 1e-9));
	const nv = Math.max(1, Math.ceil((p.height ?? 0) / p.mesh - 1e-9));
	return { nu, nv, pieces: nu * (nv + 1) + nv * (nu + 1) };
}

function rectanglePieces(p: PlateWire, item: number): Piece[] {
	const { nu, nv } = rectangleCounts(p);
	const w = p.width ?? 0;
	const h = p.height ?? 0;
	const ax = AXES[p.plane];
	const node: Vec3[][] = [];
	for (let i = 0; i <= nu; i++) {
		node.push([]);
		for (let j = 0; j <= nv; j++)
			node[i].push(inFrame(p.centre, ax, -w / 2 + (w * i) / nu, -h / 2 + (h * j) / nv, 0));
	}
	const out: Piece[] = [];
	const add = (a: Vec3, b: Vec3) =>
		out.push({ from: a, to: b, radius: p.radius, item, piece: out.length });
	for (let j = 0; j <= nv; j++) for (let i = 0; i < nu; i++) add(node[i][j], node[i + 1][j]);
	for (let i = 0; i <= nu; i++) for (let j = 0; j < nv; j++) add(node[i][j], node[i][j + 1]);
	return out;
}

/**
 * Rings k = 1…K at radius k·R/K (K = ⌈R/mesh⌉); ring k has n_k nodes, n_1 the fewest with chords
 * ≤ mesh (at least 3), doubling outwards whenever a chord would exceed the mesh, so every inner node
 * continues outwards as a spoke.
 */
function discRings(p: PlateWire) {
	const r = (p.diameter ?? 0) / 2;
	const rings = Math.max(1, Math.ceil(r / p.mesh - 1e-9));
	const counts: number[] = [];
	let pieces = 0;
	for (let k = 1; k <= rings && pieces <= MAX_WIRES; k++) {
		const rk = (r * k) / rings;
		const chordOk = (n: number) => 2 * rk * Math.sin(Math.PI / n) <= p.mesh * (1 + 1e-9);
		let n = k === 1 ? 3 : counts[k - 2];
		while (!chordOk(n)) n = k === 1 ? n + 1 : n * 2;
		counts.push(n);
		pieces += 2 * n; // the ring's chords and the spokes reaching it
	}
	return { r, rings, counts, pieces };
}

function discPieces(p: PlateWire, item: number): Piece[] {
	const { r, rings, counts } = discRings(p);
	const ax = AXES[p.plane];
	const out: Piece[] = [];
	const add = (a: Vec3, b: Vec3) =>
		out.push({ from: a, to: b, radius: p.radius, item, piece: out.length });
	let inner: Vec3[] = [p.centre];
	for (let k = 1; k <= rings; k++) {
		const n = counts[k - 1];
		const rk = (r * k) / rings;
		const ring: Vec3[] = [];
		for (let i = 0; i < n; i++) {
			const phi = (2 * Math.PI * i) / n;
			ring.push(circlePoint(p.centre, ax, rk, phi));
		}
		for (let i = 0; i < n; i++) add(ring[i], ring[(i + 1) % n]);
		if (k === 1) for (const q of ring) add(inner[0], q);
		else {
			const step = n / inner.length;
			for (let i = 0; i < inner.length; i++) add(inner[i], ring[i * step]);
		}
		inner = ring;
	}
	return out;
}

/** Straight pieces of one (already range-checked) model item. */
export function expandItem(it: ModelItem, item: number): ExpandedItem {
	switch (it.kind) {
		case 'wire':
			return {
				pieces: [
					{ from: it.from, to: it.to, radius: it.radius, segments: it.segments, item, piece: 0 }
				],
				path: true
			};
		case 'arc':
			return { pieces: chain(arcPoints(it), it.radius, item), path: true };
		case 'helix':
			return { pieces: chain(helixPoints(it), it.radius, item), path: true };
		case 'plate':
			return {
				pieces: it.shape === 'rectangle' ? rectanglePieces(it, item) : discPieces(it, item),
				path: false
			};
	}
}

import { expandItem, type ExpandedItem, type Piece } from './generators';
import type { SegmentArrays } from './kernel';
import {
	C,
	COPPER_S_PER_M,
	MAX_SEGMENTS,
	MIN_SEGMENT_RADII,
	SEGMENTS_PER_WAVELENGTH
} from './limits';
import type { LumpedLoad, ModelIssue, ModelResult, Vec3, WireModel, WirePoint } from './types';
import { checkItems, checkPieces, itemLabel, pieceLabel, resolvePoint } from './validate';

/**
 * An evaluated model cut into segments, with the unknowns of the moment method: one triangle
 * (piecewise-linear) current per interior node, k − 1 at a junction of k segments, and one half
 * triangle per segment end on the ground plane (its image completes it).
 */

/**
 * Where a feed, load or port sits: the bases that carry its current, each with sign ±1 so that
 * the port current is the one flowing along the wire (from → to) through that point.
 */
export interface Port {
	bases: Int32Array;
	signs: Float64Array;
	point: Vec3;
	/** Position actually used along the item (the nearest node). */
	position: number;
	label: string;
}

export interface Geometry {
	segments: SegmentArrays;
	/** Mirror images in z = 0 (present with a ground plane); image currents carry a factor −1. */
	images: SegmentArrays | null;
	/** Node of each segment's start and end. */
	node0: Int32Array;
	node1: Int32Array;
	grounded: Uint8Array;
	/** Piece (straight wire) each segment belongs to, and pieces' labels. */
	pieceOf: Int32Array;
	pieceLabels: string[];
	/** Basis pieces per segment (CSR): basis index, sign σ, value α + βt along the segment. */
	pieceStart: Int32Array;
	basisOf: Int32Array;
	sigma: Float64Array;
	alpha: Float64Array;
	beta: Float64Array;
	bases: number;
	feed: Port;
	/** The feed, then any ports asked for in GeometryOptions.ports. */
	ports: Port[];
	loads: { port: Port; load: LumpedLoad }[];
	conductivity: number | null;
	/** The frequency the default segment rule used. */
	top_hz: number;
}

interface PointOnPiece {
	piece: number;
	local: number;
}

function pieceLength(p: Piece): number {
	return Math.hypot(p.to[0] - p.from[0], p.to[1] - p.from[1], p.to[2] - p.from[2]);
}

/** The piece and position along it for a 0…1 position along a whole item. */
function locate(exp: ExpandedItem, first: number, position: number): PointOnPiece {
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

function arrays(n: number): SegmentArrays {
	const f = () => new Float64Array(n);
	return { n, sx: f(), sy: f(), sz: f(), ux: f(), uy: f(), uz: f(), len: f(), rad: f() };
}

function mirror(s: SegmentArrays): SegmentArrays {
	const m = arrays(s.n);
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
function mergeEnds(pieces: Piece[], tol: number): { ends: Int32Array; points: Vec3[] } {
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

export interface GeometryOptions {
	/** A per-request segment cap below MAX_SEGMENTS. */
	maxSegments?: number;
	/** More ports besides the feed (for solvePorts); segments are placed so each sits on a node. */
	ports?: WirePoint[];
}

/**
 * Expands, checks and discretises a model. `top_hz` is the highest frequency it will be solved at
 * (for the default segment rule). Never throws for bad input: a failure names the wire.
 */
export function buildGeometry(
	model: WireModel,
	top_hz: number,
	options: GeometryOptions = {}
): ModelResult<Geometry> {
	const cap = Math.min(options.maxSegments ?? MAX_SEGMENTS, MAX_SEGMENTS);
	const extraPorts = options.ports ?? [];
	const warnings: string[] = [];
	const fail = (error: ModelIssue): ModelResult<Geometry> => ({ ok: false, error });
	const itemProblem = checkItems(model);
	if (itemProblem) return fail(itemProblem);

	const expanded = model.wires.map((w, i) => expandItem(w, i));
	const firstPiece: number[] = [];
	const pieces: Piece[] = [];
	for (const e of expanded) {
		firstPiece.push(pieces.length);
		pieces.push(...e.pieces);
	}
	let extent = 0;
	for (const p of pieces)
		for (const v of [...p.from, ...p.to]) extent = Math.max(extent, Math.abs(v));
	const tol = Math.max(1e-9, 1e-7 * extent);
	const { ends, points } = mergeEnds(pieces, tol);
	const pieceProblem = checkPieces(model, pieces, ends, tol);
	if (pieceProblem) return fail(pieceProblem);

	// Feed and loads: the item, then the piece and the position along it.
	const spots: { where: WirePoint; path: string; what: string; at?: PointOnPiece }[] = [
		{ where: model.feed, path: 'feed', what: 'feed' },
		...(model.loads ?? []).map((l, i) => ({
			where: l as WirePoint,
			path: `loads[${i}]`,
			what: `load ${i + 1}`
		})),
		...extraPorts.map((where, i) => ({ where, path: `ports[${i}]`, what: `port ${i + 2}` }))
	];
	for (const s of spots) {
		const r = resolvePoint(model, s.where, s.path, s.what);
		if ('message' in r) return fail(r);
		s.at = locate(expanded[r.item], firstPiece[r.item], s.where.position);
	}

	// Segments per piece.
	const counts = pieces.map((p, i) => {
		if (p.segments !== undefined) return p.segments;
		const locals = spots.filter((s) => s.at!.piece === i).map((s) => s.at!.local);
		return defaultSegments(pieceLength(p), p.radius, top_hz, locals);
	});
	const total = counts.reduce((a, b) => a + b, 0);
	if (total > cap) {
		const perItem = new Map<number, number>();
		pieces.forEach((p, i) => perItem.set(p.item, (perItem.get(p.item) ?? 0) + counts[i]));
		const [big, n] = [...perItem.entries()].sort((a, b) => b[1] - a[1])[0];
		return fail({
			message: `the model needs ${total} segments at ${+(top_hz / 1e6).toPrecision(6)} MHz, more than the limit of ${cap} (${itemLabel(model, big)} alone has ${n})`,
			path: `wires[${big}]`,
			item: big
		});
	}
	const lambdaTop = C / top_hz;
	for (let i = 0; i < pieces.length; i++) {
		const p = pieces[i];
		const d = pieceLength(p) / counts[i];
		const where = { path: `wires[${p.item}]`, item: p.item };
		if (d < p.radius)
			return fail({
				message: `${pieceLabel(model, p)}: its segments (${+(d * 1000).toPrecision(3)} mm) are shorter than its radius (${+(p.radius * 1000).toPrecision(3)} mm); use fewer segments or a thinner wire`,
				...where
			});
		if (d < MIN_SEGMENT_RADII * p.radius)
			warnings.push(
				`${pieceLabel(model, p)}: segments are only ${(d / p.radius).toFixed(1)} radii long; the thin-wire model is strained`
			);
		if (d > lambdaTop / 10)
			warnings.push(
				`${pieceLabel(model, p)}: segments are longer than λ/10 at the top of the band`
			);
		if (
			(2 * Math.PI * p.radius) / lambdaTop > 0.1 &&
			!warnings.some((w) => w.startsWith(itemLabel(model, p.item) + ' is thick'))
		)
			warnings.push(
				`${itemLabel(model, p.item)} is thick for the thin-wire model (circumference ${((2 * Math.PI * p.radius) / lambdaTop).toFixed(2)} λ)`
			);
	}

	// Segment arrays and nodes (piece ends keep their merged node; interior nodes are new).
	const segs = arrays(total);
	const node0 = new Int32Array(total);
	const node1 = new Int32Array(total);
	const pieceOf = new Int32Array(total);
	const segFirst: number[] = [];
	let nodes = points.length;
	let s = 0;
	for (let i = 0; i < pieces.length; i++) {
		const p = pieces[i];
		const n = counts[i];
		const len = pieceLength(p);
		segFirst.push(s);
		const u = [
			(p.to[0] - p.from[0]) / len,
			(p.to[1] - p.from[1]) / len,
			(p.to[2] - p.from[2]) / len
		];
		for (let j = 0; j < n; j++, s++) {
			segs.sx[s] = p.from[0] + ((p.to[0] - p.from[0]) * j) / n;
			segs.sy[s] = p.from[1] + ((p.to[1] - p.from[1]) * j) / n;
			segs.sz[s] = p.from[2] + ((p.to[2] - p.from[2]) * j) / n;
			segs.ux[s] = u[0];
			segs.uy[s] = u[1];
			segs.uz[s] = u[2];
			segs.len[s] = len / n;
			segs.rad[s] = p.radius;
			pieceOf[s] = i;
			node0[s] = j === 0 ? ends[2 * i] : node1[s - 1];
			node1[s] = j === n - 1 ? ends[2 * i + 1] : nodes++;
		}
	}
	const grounded = new Uint8Array(nodes);
	if (model.ground) points.forEach((pt, k) => (grounded[k] = Math.abs(pt[2]) <= tol ? 1 : 0));

	// Bases: at each node, attached segment ends in segment order.
	const attached: number[][] = Array.from({ length: nodes }, () => []);
	for (let k = 0; k < total; k++) {
		attached[node0[k]].push(2 * k);
		attached[node1[k]].push(2 * k + 1);
	}
	const items: { seg: number; basis: number; sigma: number; alpha: number; beta: number }[] = [];
	// A segment end: into the node is +u at the end (t = 1, value t) and −u at the start (value 1 − t).
	const piece = (end: number, basis: number, into: boolean) => {
		const seg = end >> 1;
		const atEnd = (end & 1) === 1;
		items.push({
			seg,
			basis,
			sigma: (atEnd ? 1 : -1) * (into ? 1 : -1),
			alpha: atEnd ? 0 : 1,
			beta: atEnd ? 1 : -1
		});
	};
	let bases = 0;
	const basisAt: { node: number; into: number; out: number }[] = [];
	for (let v = 0; v < nodes; v++) {
		const list = attached[v];
		if (grounded[v]) {
			for (const e of list) {
				piece(e, bases, true);
				basisAt.push({ node: v, into: e, out: -1 });
				bases++;
			}
		} else {
			for (let i = 1; i < list.length; i++) {
				piece(list[0], bases, true);
				piece(list[i], bases, false);
				basisAt.push({ node: v, into: list[0], out: list[i] });
				bases++;
			}
		}
	}
	items.sort((a, b) => a.seg - b.seg);
	const pieceStart = new Int32Array(total + 1);
	for (const it of items) pieceStart[it.seg + 1]++;
	for (let k = 0; k < total; k++) pieceStart[k + 1] += pieceStart[k];

	const portAt = (spot: (typeof spots)[number]): Port | ModelIssue => {
		const at = spot.at!;
		const n = counts[at.piece];
		const j = Math.round(at.local * n);
		const seg = segFirst[at.piece] + Math.max(0, j - 1);
		const end = 2 * seg + (j === 0 ? 0 : 1);
		const orient = j === 0 ? -1 : 1;
		const node = j === 0 ? node0[seg] : node1[seg];
		const idx: number[] = [];
		const sg: number[] = [];
		basisAt.forEach((b, m) => {
			if (b.node !== node) return;
			// signs make the port current flow along the wire (from → to) through the port
			if (b.into === end) (idx.push(m), sg.push(orient));
			else if (b.out === end) (idx.push(m), sg.push(-orient));
		});
		const label = pieceLabel(model, pieces[at.piece]);
		if (idx.length === 0)
			return {
				message: `${spot.what} is at the free end of ${label}; put it inside the wire, at a junction or where the wire meets the ground plane`,
				path: `${spot.path}.position`,
				item: pieces[at.piece].item
			};
		const exp = expanded[pieces[at.piece].item];
		const lens = exp.pieces.map(pieceLength);
		const before = lens
			.slice(0, at.piece - firstPiece[pieces[at.piece].item])
			.reduce((a, b) => a + b, 0);
		const position =
			(before + (lens[at.piece - firstPiece[pieces[at.piece].item]] * j) / n) /
			lens.reduce((a, b) => a + b, 0);
		if (Math.abs(position - spot.where.position) > 1e-6)
			warnings.push(
				`${spot.what} moved to the nearest segment end: position ${position.toFixed(4)} of ${itemLabel(model, pieces[at.piece].item)}`
			);
		const p = pieces[at.piece];
		const point: Vec3 = [0, 1, 2].map((c) => p.from[c] + ((p.to[c] - p.from[c]) * j) / n) as Vec3;
		return { bases: Int32Array.from(idx), signs: Float64Array.from(sg), point, position, label };
	};
	const feed = portAt(spots[0]);
	if ('message' in feed) return fail(feed);
	const loads: Geometry['loads'] = [];
	const ports: Port[] = [feed];
	for (let i = 1; i < spots.length; i++) {
		const port = portAt(spots[i]);
		if ('message' in port) return fail(port);
		if (i <= (model.loads ?? []).length) loads.push({ port, load: model.loads![i - 1] });
		else ports.push(port);
	}
	const geometry: Geometry = {
		segments: segs,
		images: model.ground ? mirror(segs) : null,
		node0,
		node1,
		grounded,
		pieceOf,
		pieceLabels: pieces.map((p) => pieceLabel(model, p)),
		pieceStart,
		basisOf: Int32Array.from(items, (x) => x.basis),
		sigma: Float64Array.from(items, (x) => x.sigma),
		alpha: Float64Array.from(items, (x) => x.alpha),
		beta: Float64Array.from(items, (x) => x.beta),
		bases,
		feed,
		ports,
		loads,
		conductivity:
			model.conductivity_s_per_m === undefined ? COPPER_S_PER_M : model.conductivity_s_per_m,
		top_hz
	};
	return { ok: true, value: geometry, warnings };
}

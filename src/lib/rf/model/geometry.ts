import { buildBases } from './bases';
import { expandItem, type Piece } from './generators';
import type { SegmentArrays } from './kernel';
import { C, COPPER_S_PER_M, MAX_SEGMENTS, MIN_SEGMENT_RADII } from './limits';
import {
	defaultSegments,
	locate,
	mergeEnds,
	mirror,
	pieceLength,
	segmentArrays,
	type PointOnPiece
} from './segments';
import type { LumpedLoad, ModelIssue, ModelResult, Vec3, WireModel, WirePoint } from './types';
import { checkItems, checkPieces, itemLabel, pieceLabel, resolvePoint } from './validate';

/**
 * An evaluated model checked, expanded and cut into segments, with the unknowns of the moment
 * method (bases.ts) and the ports of its feed, loads and any extra ports.
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
	const segs = segmentArrays(total);
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

	const {
		count: bases,
		at: basisAt,
		pieceStart,
		basisOf,
		sigma,
		alpha,
		beta
	} = buildBases(node0, node1, nodes, grounded);

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
			const sign = b.into === end ? orient : b.out === end ? -orient : 0;
			if (sign === 0) return;
			idx.push(m);
			sg.push(sign);
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
		basisOf,
		sigma,
		alpha,
		beta,
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

import { pieceCount, type Piece } from './generators';
import { MAX_EXTENT_M, MAX_NAME_CHARS, MAX_SEGMENTS, MAX_WIRES, MIN_RADIUS_M } from './limits';
import type { ModelIssue, ModelItem, Vec3, WireModel, WirePoint } from './types';

/**
 * Checks of an evaluated model that refuse what the solver cannot solve, each with a message that
 * names the wire: value ranges per item, unique names, the piece cap, zero-length pieces, wires
 * below or along the ground plane, and wires that touch or cross other than at shared end points.
 */

const KIND_WORD = { wire: 'wire', arc: 'arc', helix: 'helix', plate: 'plate' } as const;

/** 'wire 3 "driven"' — 1-based, with the name when there is one. */
export function labelFor(kind: string, item: number, name?: unknown): string {
	return `${kind} ${item + 1}${typeof name === 'string' && name ? ` "${name.slice(0, MAX_NAME_CHARS)}"` : ''}`;
}

export function itemLabel(model: WireModel, item: number): string {
	const it = model.wires[item];
	return labelFor(KIND_WORD[it.kind], item, it.name);
}

export function pieceLabel(model: WireModel, p: Piece): string {
	return model.wires[p.item].kind === 'wire'
		? itemLabel(model, p.item)
		: `${itemLabel(model, p.item)}, piece ${p.piece + 1}`;
}

const mm = (v: number) => `${+(v * 1000).toPrecision(4)} mm`;
const at = (p: Vec3) => `(${p.map((v) => +(v * 1000).toPrecision(4)).join(', ')}) mm`;

function issue(model: WireModel, item: number, field: string, text: string): ModelIssue {
	return {
		message: `${itemLabel(model, item)}: ${text}`,
		path: `wires[${item}]${field ? '.' + field : ''}`,
		item
	};
}

const isInt = (v: number | undefined, lo: number, hi: number) =>
	v !== undefined && Number.isInteger(v) && v >= lo && v <= hi;

/** Range checks for one item; null when it is fine. */
function checkItem(model: WireModel, i: number): ModelIssue | null {
	const it: ModelItem = model.wires[i];
	const bad = (field: string, text: string) => issue(model, i, field, text);
	if (!(it.radius >= MIN_RADIUS_M))
		return bad('radius', `radius must be at least ${MIN_RADIUS_M * 1e6} µm (it is ${it.radius} m)`);
	const points: [string, Vec3][] =
		it.kind === 'wire'
			? [
					['from', it.from],
					['to', it.to]
				]
			: it.kind === 'helix'
				? [['base', it.base]]
				: [['centre', it.centre]];
	for (const [field, p] of points)
		if (!p.every((v) => Math.abs(v) <= MAX_EXTENT_M))
			return bad(field, `${field} lies more than ${MAX_EXTENT_M} m from the origin`);
	const size = (field: string, v: number | undefined) =>
		v !== undefined && v > 0 && v <= MAX_EXTENT_M
			? null
			: bad(field, `${field.replace('_', ' ')} must be a positive length in metres`);
	switch (it.kind) {
		case 'wire':
			if (it.segments !== undefined && !isInt(it.segments, 1, MAX_SEGMENTS))
				return bad('segments', `segments must be a whole number from 1 to ${MAX_SEGMENTS}`);
			return null;
		case 'arc': {
			const span = Math.abs(it.end_deg - it.start_deg);
			if (!(span > 0 && span <= 360 + 1e-9))
				return bad('end_deg', 'the arc must span more than 0° and at most 360°');
			if (!isInt(it.pieces, span >= 360 - 1e-9 ? 3 : 1, MAX_WIRES))
				return bad(
					'pieces',
					`pieces must be a whole number from ${span >= 360 - 1e-9 ? 3 : 1} to ${MAX_WIRES} (a closed loop needs 3)`
				);
			return size('arc_radius', it.arc_radius);
		}
		case 'helix':
			if (!(it.turns > 0 && it.turns <= MAX_WIRES))
				return bad('turns', 'turns must be more than 0');
			if (!(it.pitch >= 0 && it.pitch <= MAX_EXTENT_M))
				return bad('pitch', 'pitch must be a length of 0 m or more');
			if (it.turns > 1 && it.pitch <= 2 * it.radius)
				return bad(
					'pitch',
					`the turns touch: the pitch (${mm(it.pitch)}) must exceed the wire diameter (${mm(2 * it.radius)})`
				);
			if (!isInt(it.pieces_per_turn, 3, MAX_WIRES))
				return bad(
					'pieces_per_turn',
					`pieces per turn must be a whole number from 3 to ${MAX_WIRES}`
				);
			if (pieceCount(it) > MAX_WIRES)
				return bad('turns', `turns × pieces per turn is more than ${MAX_WIRES} pieces`);
			return size('helix_radius', it.helix_radius);
		case 'plate': {
			if (!(it.mesh > 0 && it.mesh <= MAX_EXTENT_M))
				return bad('mesh', 'mesh must be a positive length in metres');
			const dims =
				it.shape === 'rectangle'
					? [size('width', it.width), size('height', it.height)]
					: [size('diameter', it.diameter)];
			const wrong = dims.find((d) => d);
			if (wrong) return wrong;
			const d = it.shape === 'rectangle' ? Math.max(it.width!, it.height!) : it.diameter!;
			if (d / it.mesh > MAX_WIRES || pieceCount(it) > MAX_WIRES)
				return bad('mesh', `the mesh is too fine: more than ${MAX_WIRES} pieces`);
			return null;
		}
	}
}

/** Item ranges, unique names and the total piece cap. */
export function checkItems(model: WireModel): ModelIssue | null {
	const names = new Map<string, number>();
	let pieces = 0;
	for (let i = 0; i < model.wires.length; i++) {
		const problem = checkItem(model, i);
		if (problem) return problem;
		const name = model.wires[i].name;
		if (name !== undefined) {
			if (names.has(name))
				return issue(
					model,
					i,
					'name',
					`another wire (${itemLabel(model, names.get(name)!)}) has the same name`
				);
			names.set(name, i);
		}
		pieces += pieceCount(model.wires[i]);
		if (pieces > MAX_WIRES)
			return issue(
				model,
				i,
				'',
				`the model has more than ${MAX_WIRES} straight pieces with this one`
			);
	}
	for (const [i, l] of (model.loads ?? []).entries()) {
		const where = (field: string, text: string) => ({
			message: `load ${i + 1}: ${text}`,
			path: `loads[${i}]${field}`
		});
		const given = (['r_ohm', 'l_h', 'c_f'] as const).filter((k) => l[k] !== undefined);
		if (given.length === 0) return where('', 'give at least one of r_ohm, l_h, c_f');
		for (const k of given)
			if (!(l[k]! >= 0 && l[k]! < 1e15))
				return where(`.${k}`, `${k} must be a number of 0 or more`);
		if (l.arrangement === 'series' && l.c_f === 0)
			return where('.c_f', 'a series capacitor of 0 F is an open circuit; leave c_f out for none');
	}
	if (model.conductivity_s_per_m != null && !(model.conductivity_s_per_m > 0))
		return {
			message: 'conductivity must be a positive number of S/m, or null for a perfect conductor',
			path: 'conductivity_s_per_m'
		};
	return null;
}

/** The item a feed or load refers to, by name or 1-based number; it must run end to end. */
export function resolvePoint(
	model: WireModel,
	point: WirePoint,
	path: string,
	what: string
): { item: number } | ModelIssue {
	const wire = point.wire;
	const item =
		typeof wire === 'number'
			? Number.isInteger(wire) && wire >= 1 && wire <= model.wires.length
				? wire - 1
				: -1
			: model.wires.findIndex((w) => w.name === wire);
	if (item < 0)
		return {
			message: `${what}: there is no wire ${typeof point.wire === 'number' ? point.wire : `named "${point.wire}"`}`,
			path: `${path}.wire`
		};
	if (model.wires[item].kind === 'plate')
		return {
			message: `${what}: ${itemLabel(model, item)} is a grid; put the ${what} on a wire, arc or helix`,
			path: `${path}.wire`,
			item
		};
	if (!(point.position >= 0 && point.position <= 1))
		return {
			message: `${what}: position must lie between 0 and 1 along ${itemLabel(model, item)} (it is ${point.position})`,
			path: `${path}.position`,
			item
		};
	return { item };
}

/** Closest distance between segments [p0, p1] and [q0, q1] (Ericson, Real-Time Collision Detection, §5.1.9 [Ericson2005]). */
export function segmentDistance(
	p0: Vec3,
	p1: Vec3,
	q0: Vec3,
	q1: Vec3
): { dist: number; at: Vec3 } {
	const d1 = sub(p1, p0);
	const d2 = sub(q1, q0);
	const r = sub(p0, q0);
	const a = dot(d1, d1);
	const e = dot(d2, d2);
	const f = dot(d2, r);
	let s = 0;
	let t = 0;
	if (a === 0 && e === 0) {
		s = t = 0;
	} else if (a === 0) {
		t = clamp(f / e);
	} else {
		const c = dot(d1, r);
		if (e === 0) s = clamp(-c / a);
		else {
			const b = dot(d1, d2);
			const den = a * e - b * b;
			s = den > 0 ? clamp((b * f - c * e) / den) : 0;
			t = (b * s + f) / e;
			if (t < 0) {
				t = 0;
				s = clamp(-c / a);
			} else if (t > 1) {
				t = 1;
				s = clamp((b - c) / a);
			}
		}
	}
	const cp: Vec3 = [p0[0] + d1[0] * s, p0[1] + d1[1] * s, p0[2] + d1[2] * s];
	const cq: Vec3 = [q0[0] + d2[0] * t, q0[1] + d2[1] * t, q0[2] + d2[2] * t];
	return { dist: Math.hypot(cp[0] - cq[0], cp[1] - cq[1], cp[2] - cq[2]), at: cp };
}

const sub = (a: Vec3, b: Vec3): Vec3 => [a[0] - b[0], a[1] - b[1], a[2] - b[2]];
const dot = (a: Vec3, b: Vec3) => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
const clamp = (v: number) => (v < 0 ? 0 : v > 1 ? 1 : v);
const length = (p: Piece) =>
	Math.hypot(p.to[0] - p.from[0], p.to[1] - p.from[1], p.to[2] - p.from[2]);

/**
 * Geometric checks of the straight pieces; `ends` gives the merged node of each piece's from/to
 * end, `grounded` whether a node lies on the ground plane, `tol` the join tolerance in metres.
 */
export function checkPieces(
	model: WireModel,
	pieces: Piece[],
	ends: Int32Array,
	tol: number
): ModelIssue | null {
	const path = (p: Piece) => `wires[${p.item}]`;
	for (const p of pieces) {
		if (length(p) <= tol)
			return {
				message: `${pieceLabel(model, p)} has zero length (both ends at ${at(p.from)})`,
				path: path(p),
				item: p.item
			};
		if (!model.ground) continue;
		const lo = Math.min(p.from[2], p.to[2]);
		const hi = Math.max(p.from[2], p.to[2]);
		const bad = (text: string) => ({
			message: `${pieceLabel(model, p)} ${text}`,
			path: path(p),
			item: p.item
		});
		if (lo < -tol) return bad(`goes below the ground plane (z = ${mm(lo)})`);
		if (hi <= p.radius)
			return bad(
				`lies along the ground plane: at least one end must be higher than the wire radius (${mm(p.radius)})`
			);
		if (lo > tol && lo < p.radius)
			return bad(
				`ends ${mm(lo)} above the ground plane, closer than its radius; end it at z = 0 to connect it, or raise it`
			);
	}
	// boxes around each piece, grown by its radius: most pairs are told apart by them alone
	const box = pieces.map((p) =>
		[0, 1, 2].flatMap((c) => [
			Math.min(p.from[c], p.to[c]) - p.radius,
			Math.max(p.from[c], p.to[c]) + p.radius
		])
	);
	const apart = (i: number, j: number) =>
		box[i][1] < box[j][0] ||
		box[j][1] < box[i][0] ||
		box[i][3] < box[j][2] ||
		box[j][3] < box[i][2] ||
		box[i][5] < box[j][4] ||
		box[j][5] < box[i][4];
	for (let i = 0; i < pieces.length; i++) {
		const a = pieces[i];
		for (let j = i + 1; j < pieces.length; j++) {
			if (apart(i, j)) continue;
			const b = pieces[j];
			const gap = a.radius + b.radius;
			const shared = [ends[2 * i], ends[2 * i + 1]].filter(
				(n) => n === ends[2 * j] || n === ends[2 * j + 1]
			);
			const clash = (text: string, where: Vec3) => ({
				message: `${pieceLabel(model, a)} ${text} ${pieceLabel(model, b)} at ${at(where)}; wires may meet only at shared end points`,
				path: path(b),
				item: b.item
			});
			if (shared.length === 2) return clash('runs along', a.from);
			if (shared.length === 1) {
				// Away from the common node, the two must open up faster than their radii.
				const node = ends[2 * i] === shared[0] ? a.from : a.to;
				const da = sub(ends[2 * i] === shared[0] ? a.to : a.from, node);
				const db = sub(ends[2 * j] === shared[0] ? b.to : b.from, node);
				const la = Math.hypot(...da);
				const lb = Math.hypot(...db);
				const cos = dot(da, db) / (la * lb);
				if (cos > 0 && Math.min(la, lb) * Math.sqrt(Math.max(0, 1 - cos * cos)) < gap)
					return clash('folds back along', node);
				continue;
			}
			const d = segmentDistance(a.from, a.to, b.from, b.to);
			if (d.dist < gap)
				return clash(
					d.dist <= tol
						? 'crosses or touches'
						: `comes within ${mm(d.dist)} (less than the radii) of`,
					d.at
				);
		}
	}
	return null;
}

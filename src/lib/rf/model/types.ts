/**
 * The wire model as plain data. `S` is the type of every scalar: `number` (metres, degrees, ohms…)
 * once evaluated, or `Scalar` (a number or a formula string) in a template the design file keeps.
 * Lengths are metres, angles degrees, frequencies hertz; all names are ours.
 */

export type Scalar = number | string;

export interface Complex {
	re: number;
	im: number;
}
export type Vec3<S = number> = [S, S, S];
export type Plane = 'xy' | 'yz' | 'zx';

interface Named<S> {
	/** Shown in messages ("wire 3 "driven""); feeds and loads may refer to it. */
	name?: string;
	/** Wire radius (not diameter), metres. */
	radius: S;
}

/** A straight wire from `from` to `to`; `segments` overrides the default rule. */
interface StraightWire<S = number> extends Named<S> {
	kind: 'wire';
	from: Vec3<S>;
	to: Vec3<S>;
	segments?: S;
}

/**
 * An arc of a circle in a plane parallel to `plane` through `centre`, from `start_deg` to `end_deg`
 * (counter-clockwise seen from the plane's normal: xy → +z, yz → +x, zx → +y), made of `pieces`
 * straight wires whose ends lie on the circle. A 360° arc closes on itself.
 */
export interface ArcWire<S = number> extends Named<S> {
	kind: 'arc';
	centre: Vec3<S>;
	plane: Plane;
	arc_radius: S;
	start_deg: S;
	end_deg: S;
	pieces: S;
}

/**
 * A helix whose axis runs along +`axis` from `base` (the axis point at the start), `turns` turns of
 * `pitch` metres each at `helix_radius`, `pieces_per_turn` straight wires per turn. Right-handed
 * turns counter-clockwise seen from the tip (as a right-hand screw advances); the first point is at
 * `start_deg` around the axis (0° on the next axis in x→y→z order: +x for a z axis).
 */
export interface HelixWire<S = number> extends Named<S> {
	kind: 'helix';
	base: Vec3<S>;
	axis: 'x' | 'y' | 'z';
	turns: S;
	pitch: S;
	helix_radius: S;
	pieces_per_turn: S;
	hand: 'right' | 'left';
	start_deg?: S;
}

/**
 * A flat conductor as a wire grid in a plane parallel to `plane` through `centre`: a rectangle
 * `width` × `height` (along the plane's first and second axes) meshed into cells no larger than
 * `mesh`, or a disc of `diameter` as rings `mesh` apart joined by spokes, no chord longer than `mesh`.
 */
export interface PlateWire<S = number> extends Named<S> {
	kind: 'plate';
	shape: 'rectangle' | 'disc';
	centre: Vec3<S>;
	plane: Plane;
	width?: S;
	height?: S;
	diameter?: S;
	mesh: S;
}

export type ModelItem<S = number> = StraightWire<S> | ArcWire<S> | HelixWire<S> | PlateWire<S>;

/**
 * A point on a wire, arc or helix: `wire` is its name or its 1-based number in `wires`;
 * `position` runs 0…1 along it (by length; 0 = `from`, the arc's start, the helix's base end).
 */
export interface WirePoint<S = number> {
	wire: string | number;
	position: S;
}

/** A lumped load in series with the wire at a point: R, L and C in series or in parallel. */
export interface LumpedLoad<S = number> extends WirePoint<S> {
	arrangement: 'series' | 'parallel';
	r_ohm?: S;
	l_h?: S;
	c_f?: S;
}

export interface WireModel<S = number> {
	wires: ModelItem<S>[];
	feed: WirePoint<S>;
	loads?: LumpedLoad<S>[];
	/** A perfectly conducting ground plane at z = 0 (solved by images); wires may end on it. */
	ground?: boolean;
	/** Wire conductivity, S/m; copper when absent, `null` for a perfect conductor. */
	conductivity_s_per_m?: S | null;
}

export type ModelTemplate = WireModel<Scalar>;

/** A failure that names the wire (or field) it is about. `path` is in the input's own terms. */
export interface ModelIssue {
	message: string;
	path: string;
	/** 0-based index into `wires` when the issue is about one item. */
	item?: number;
}

export type ModelResult<T> =
	{ ok: true; value: T; warnings: string[] } | { ok: false; error: ModelIssue };

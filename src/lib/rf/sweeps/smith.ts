/**
 * Smith chart geometry in the Γ plane (unit circle = |Γ| = 1) and its mapping to SVG, where y
 * grows downward. Normalized impedance z = r + jx maps to Γ = (z − 1)/(z + 1).
 */

export interface ChartFrame {
	cx: number;
	cy: number;
	/** SVG length of |Γ| = 1. */
	radius: number;
}

export interface Circle {
	cx: number;
	cy: number;
	r: number;
}

export function gammaFromImpedance(r: number, x: number): { re: number; im: number } {
	const d = (r + 1) * (r + 1) + x * x;
	return { re: (r * r + x * x - 1) / d, im: (2 * x) / d };
}

export function toChart(re: number, im: number, frame: ChartFrame): { x: number; y: number } {
	return { x: frame.cx + re * frame.radius, y: frame.cy - im * frame.radius };
}

/** Constant-resistance circle in the Γ plane: centre (r/(1+r), 0), radius 1/(1+r). */
export function constantRCircle(r: number): Circle {
	if (!(r >= 0)) throw new RangeError('r must be ≥ 0');
	return { cx: r / (1 + r), cy: 0, r: 1 / (1 + r) };
}

/** Constant-reactance circle in the Γ plane: centre (1, 1/x), radius 1/|x|; only its arc inside |Γ| ≤ 1 is drawn. */
export function constantXCircle(x: number): Circle {
	if (!(x !== 0 && Number.isFinite(x))) throw new RangeError('x must be finite and not 0');
	return { cx: 1, cy: 1 / x, r: 1 / Math.abs(x) };
}

const fmt = (v: number) => String(Math.round(v * 1000) / 1000);

function circleOnChart(c: Circle, frame: ChartFrame): Circle {
	const p = toChart(c.cx, c.cy, frame);
	return { cx: p.x, cy: p.y, r: c.r * frame.radius };
}

/** SVG circle attributes for a constant-r circle. */
export function constantRSvg(r: number, frame: ChartFrame): Circle {
	return circleOnChart(constantRCircle(r), frame);
}

/** SVG path for the constant-x arc from the open-circuit point Γ = 1 to the rim (r = 0). */
export function constantXArcPath(x: number, frame: ChartFrame): string {
	const c = constantXCircle(x);
	const rim = gammaFromImpedance(0, x);
	const mid = gammaFromImpedance(1, x);
	const a = toChart(1, 0, frame);
	const b = toChart(rim.re, rim.im, frame);
	const m = toChart(mid.re, mid.im, frame);
	const o = toChart(c.cx, c.cy, frame);
	// the arc inside the unit circle is always under 180°; sweep direction from a point on it
	const cross = (a.x - o.x) * (m.y - o.y) - (a.y - o.y) * (m.x - o.x);
	const rr = fmt(c.r * frame.radius);
	return `M ${fmt(a.x)} ${fmt(a.y)} A ${rr} ${rr} 0 0 ${cross > 0 ? 1 : 0} ${fmt(b.x)} ${fmt(b.y)}`;
}

/** SVG polyline `points` of a sweep's Γ trace. */
export function tracePoints(
	re: ArrayLike<number>,
	im: ArrayLike<number>,
	frame: ChartFrame
): string {
	const out: string[] = [];
	for (let i = 0; i < re.length; i++) {
		const p = toChart(re[i], im[i], frame);
		out.push(`${fmt(p.x)},${fmt(p.y)}`);
	}
	return out.join(' ');
}

/** The usual grid: r and x values of the circles to draw. */
export const SMITH_GRID_R = [0, 0.2, 0.5, 1, 2, 5] as const;
export const SMITH_GRID_X = [0.2, 0.5, 1, 2, 5, -0.2, -0.5, -1, -2, -5] as const;

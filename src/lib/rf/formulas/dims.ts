/**
 * Dimension vectors in the order of mathjs's Unit.BASE_DIMENSIONS (mass, length, time, current,
 * temperature, luminous intensity, amount of substance, angle, bit), so unit literals map directly.
 * Exponents may be fractional in intermediate results (sqrt of a length).
 */
export type Dims = readonly number[];

const BASE_NAMES = ['kg', 'm', 's', 'A', 'K', 'cd', 'mol', 'rad', 'bit'];
const EPS = 1e-9;

function vec(index: number, exponent: number): Dims {
	const d = new Array<number>(9).fill(0);
	if (index >= 0) d[index] = exponent;
	return d;
}

export const DIMLESS: Dims = vec(-1, 0);
export const LENGTH: Dims = vec(1, 1);
export const FREQUENCY: Dims = vec(2, -1);
export const ANGLE: Dims = vec(7, 1);
export const SPEED: Dims = [0, 1, -1, 0, 0, 0, 0, 0, 0];

export function mulDims(a: Dims, b: Dims): Dims {
	return a.map((x, i) => x + b[i]);
}

export function divDims(a: Dims, b: Dims): Dims {
	return a.map((x, i) => x - b[i]);
}

export function powDims(a: Dims, k: number): Dims {
	return a.map((x) => (x === 0 ? 0 : x * k));
}

export function sameDims(a: Dims, b: Dims): boolean {
	return a.every((x, i) => Math.abs(x - b[i]) < EPS);
}

export function isDimless(a: Dims): boolean {
	return sameDims(a, DIMLESS);
}

export function isAngleOrDimless(a: Dims): boolean {
	return isDimless(a) || sameDims(a, ANGLE);
}

const NAMED: [Dims, string][] = [
	[DIMLESS, 'dimensionless'],
	[LENGTH, 'length'],
	[FREQUENCY, 'frequency'],
	[vec(2, 1), 'time'],
	[ANGLE, 'angle'],
	[vec(1, 2), 'area'],
	[SPEED, 'speed'],
	[vec(0, 1), 'mass']
];

/** SI base units of a dimension, like 'm^2 s^-1'; '' when dimensionless. */
export function siUnit(a: Dims): string {
	const parts: string[] = [];
	a.forEach((x, i) => {
		if (Math.abs(x) < EPS) return;
		const k = Math.round(x * 1e6) / 1e6;
		parts.push(k === 1 ? BASE_NAMES[i] : `${BASE_NAMES[i]}^${k}`);
	});
	return parts.join(' ');
}

/** A dimension in words for messages: 'length', 'frequency', or 'a quantity in m^2 s^-1'. */
export function describeDims(a: Dims): string {
	for (const [d, name] of NAMED) if (sameDims(a, d)) return name;
	return `a quantity in ${siUnit(a)}`;
}

/**
 * The allow-list of functions a formula may call, each with its dimension rule and its plain-number
 * implementation on SI values. Anything not listed here is rejected at compile time.
 */
import { DECLARATIONS, type Quantity } from './declarations';
import {
	DIMLESS,
	FREQUENCY,
	LENGTH,
	describeDims,
	isAngleOrDimless,
	isDimless,
	powDims,
	sameDims,
	type Dims
} from './dims';

/** Thrown while evaluating (e.g. below waveguide cutoff); the table reports it on the row. */
export class FormulaRuntimeError extends Error {}

interface ArgInfo {
	dims: Dims;
	text: string;
}

export interface FunctionSpec {
	min: number;
	max: number;
	/** Result dimensions, or a message saying what is wrong with the arguments. */
	dims: (args: ArgInfo[]) => Dims | string;
	impl: (...xs: number[]) => number;
}

const plain = (name: string) => (args: ArgInfo[]) => {
	const bad = args.find((a) => !isDimless(a.dims));
	return bad
		? `${name} needs a plain number, got ${describeDims(bad.dims)} (${bad.text})`
		: DIMLESS;
};

const trig = (name: string) => (args: ArgInfo[]) =>
	isAngleOrDimless(args[0].dims)
		? DIMLESS
		: `${name} needs an angle or a plain number, got ${describeDims(args[0].dims)} (${args[0].text})`;

const same = (name: string, out?: Dims) => (args: ArgInfo[]) => {
	const bad = args.find((a) => !sameDims(a.dims, args[0].dims));
	if (bad) {
		return `${name} needs arguments of one kind, got ${describeDims(args[0].dims)} and ${describeDims(bad.dims)}`;
	}
	return out ?? args[0].dims;
};

/** Typed signature for a family function: expected dimensions per argument and the result. */
const typed =
	(name: string, expect: Dims[], out: Dims) =>
	(args: ArgInfo[]): Dims | string => {
		for (let i = 0; i < args.length; i++) {
			if (!sameDims(args[i].dims, expect[i])) {
				return `${name}: argument ${i + 1} (${args[i].text}) should be ${describeDims(expect[i])}, got ${describeDims(args[i].dims)}`;
			}
		}
		return out;
	};

/** Wraps a family function so NaN (out of its domain) becomes a clear message. */
function guarded(name: string, why: string, fn: (...xs: number[]) => number) {
	return (...xs: number[]) => {
		const v = fn(...xs);
		if (Number.isNaN(v)) throw new FormulaRuntimeError(`${name}: ${why}`);
		return v;
	};
}

function roundTo(x: number, digits = 0): number {
	const p = 10 ** digits;
	return (Math.sign(x) * Math.round(Math.abs(x) * p)) / p;
}

const fixed = (
	min: number,
	max: number,
	dims: FunctionSpec['dims'],
	impl: FunctionSpec['impl']
) => ({
	min,
	max,
	dims,
	impl
});

const N = DIMLESS;
const DIMS_OF: Record<Quantity, Dims> = { frequency: FREQUENCY, length: LENGTH, number: DIMLESS };

export const FUNCTIONS: ReadonlyMap<string, FunctionSpec> = new Map<string, FunctionSpec>([
	['sqrt', fixed(1, 1, (a) => powDims(a[0].dims, 0.5), Math.sqrt)],
	['sin', fixed(1, 1, trig('sin'), Math.sin)],
	['cos', fixed(1, 1, trig('cos'), Math.cos)],
	['tan', fixed(1, 1, trig('tan'), Math.tan)],
	['asin', fixed(1, 1, plain('asin'), Math.asin)],
	['acos', fixed(1, 1, plain('acos'), Math.acos)],
	['atan', fixed(1, 1, plain('atan'), Math.atan)],
	['atan2', fixed(2, 2, same('atan2', N), Math.atan2)],
	['abs', fixed(1, 1, (a) => a[0].dims, Math.abs)],
	['round', fixed(1, 2, plain('round'), roundTo)],
	['floor', fixed(1, 1, plain('floor'), Math.floor)],
	['ceil', fixed(1, 1, plain('ceil'), Math.ceil)],
	['min', fixed(1, 16, same('min'), Math.min)],
	['max', fixed(1, 16, same('max'), Math.max)],
	[
		'log',
		fixed(1, 2, plain('log'), (x, b) => (b === undefined ? Math.log(x) : Math.log(x) / Math.log(b)))
	],
	['log10', fixed(1, 1, plain('log10'), Math.log10)],
	['exp', fixed(1, 1, plain('exp'), Math.exp)],
	// The family functions, one entry per declaration (declarations.ts).
	...DECLARATIONS.map((d): [string, FunctionSpec] => {
		const required = d.args.filter((x) => x.default === undefined).length;
		const dims = typed(
			d.name,
			d.args.map((x) => DIMS_OF[x.quantity]),
			DIMS_OF[d.result]
		);
		const impl = d.domain ? guarded(d.name, d.domain, d.impl) : d.impl;
		return [d.name, fixed(required, d.args.length, dims, impl)];
	})
]);

/** Handled by the compiler itself (pow needs a constant exponent; snap a catalogue name). */
export const SPECIAL_FUNCTIONS = ['pow', 'snap'] as const;

export const CONSTANTS: ReadonlyMap<string, number> = new Map([
	['pi', Math.PI],
	['e', Math.E],
	['tau', 2 * Math.PI]
]);

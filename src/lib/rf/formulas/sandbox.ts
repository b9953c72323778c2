/**
 * The one mathjs instance formulas meet. It is used to parse (never to evaluate user input: the
 * fast path in formula-compile walks a whitelisted AST), to resolve unit literals, and as the
 * reference evaluator tests compare against. Following the mathjs Security page, references to
 * parse/compile are kept first, then every function that parses, evaluates or changes the
 * instance is overridden to throw.
 */
import { LRUCache } from 'lru-cache';
import { all, create, type MathNode, type Unit } from 'mathjs';
import { snapValue, isCatalogueId } from '../catalogues/stock';
import { DECLARATIONS, type Quantity as Kind } from './declarations';
import type { Dims } from './dims';

const math = create(all);

type Quantity = Unit | number;
const si = (x: Quantity): number => (typeof x === 'number' ? x : (x.value as number));
const metres = (v: number): Unit => math.unit(v, 'm');
const hertz = (v: number): Unit => math.unit(v, 'Hz');

/**
 * Unit-aware versions of the declared family functions and snap, so mathjs can evaluate the same
 * formulas the fast path compiles: every declared argument, optional ones included.
 */
function referenceFunctions(): Record<string, unknown> {
	const wrap: Record<Kind, (v: number) => Quantity> = {
		length: metres,
		frequency: hertz,
		number: (v) => v
	};
	const out: Record<string, unknown> = {};
	for (const d of DECLARATIONS) {
		const required = d.args.filter((a) => a.default === undefined).length;
		const signatures: Record<string, (...a: Quantity[]) => unknown> = {};
		for (let n = required; n <= d.args.length; n++) {
			signatures[Array(n).fill('any').join(', ')] = (...xs: Quantity[]) =>
				wrap[d.result](d.impl(...xs.map(si)));
		}
		out[d.name] = math.typed(d.name, signatures);
	}
	out.snap = math.typed('snap', {
		'Unit, string': (x: Unit, id: string) => {
			if (!isCatalogueId(id)) throw new Error(`unknown catalogue ${id}`);
			return metres(snapValue(x.value as number, id));
		}
	});
	return out;
}

math.import(referenceFunctions(), {});

// Instantiate the lazily created functions used below before the overrides are in place.
math.unit(1, 'm');
const parseRef = math.parse;
const compileRef = math.compile;
/** Every name the instance knows (functions, constants), captured before the overrides. */
const MATH_NAMES: ReadonlySet<string> = new Set(Object.keys(math));

const DISABLED = [
	'import',
	'createUnit',
	'evaluate',
	'parse',
	'compile',
	'simplify',
	'simplifyConstant',
	'simplifyCore',
	'derivative',
	'resolve',
	'reviver',
	'replacer',
	'rationalize',
	'leafCount',
	'parser',
	'chain'
];
const disabled: Record<string, () => never> = {};
for (const name of DISABLED) {
	disabled[name] = () => {
		throw new Error(`function ${name} is disabled`);
	};
}
math.import(disabled, { override: true });

export function isMathName(name: string): boolean {
	return MATH_NAMES.has(name);
}

/** Parse only; throws mathjs SyntaxError (with a 1-based `char`) on bad syntax. */
export function parseExpression(text: string): MathNode {
	return parseRef(text);
}

export interface UnitLiteral {
	si: number;
	dims: Dims;
	offset: boolean;
}

// Unit names seen in formulas, with what they are (null: not a unit); a handful in practice.
const unitCache = new LRUCache<string, { literal: UnitLiteral | null }>({ max: 1000 });

/** SI factor and dimensions of a unit name such as 'mm', 'GHz', 'deg'; null if it is not a unit. */
export function unitLiteral(name: string): UnitLiteral | null {
	const hit = unitCache.get(name);
	if (hit) return hit.literal;
	let out: UnitLiteral | null = null;
	if (/^[A-Za-z_]\w*$/.test(name) && math.Unit.isValuelessUnit(name)) {
		const u = math.unit(1, name);
		const offset = u.units.some((x) => x.unit.offset !== 0);
		out = { si: u.value as number, dims: [...u.dimensions], offset };
	}
	unitCache.set(name, { literal: out });
	return out;
}

/** mathjs's own evaluation of a formula; for tests that check the fast path. */
export function referenceEvaluate(text: string, scope: Map<string, unknown>): unknown {
	return compileRef(text).evaluate(scope);
}

export function referenceUnit(value: number, unit: string): Unit {
	return math.unit(value, unit);
}

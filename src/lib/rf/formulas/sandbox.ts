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
import * as fam from './families';
import type { Dims } from './dims';

const math = create(all);

type Quantity = Unit | number;
const si = (x: Quantity): number => (typeof x === 'number' ? x : (x.value as number));
const metres = (v: number): Unit => math.unit(v, 'm');
const hertz = (v: number): Unit => math.unit(v, 'Hz');

/** Unit-aware versions of the family functions and snap, so mathjs can evaluate the same formulas. */
function referenceFunctions(): Record<string, unknown> {
	const t = (name: string, sig: string, fn: (...a: Quantity[]) => unknown) =>
		math.typed(name, { [sig]: fn });
	return {
		patch_width: t('patch_width', 'any, any', (f, er) => metres(fam.patchWidth(si(f), si(er)))),
		patch_eeff: t('patch_eeff', 'any, any, any', (er, h, w) => fam.patchEeff(si(er), si(h), si(w))),
		patch_dl: t('patch_dl', 'any, any, any', (h, w, ee) =>
			metres(fam.patchDeltaL(si(h), si(w), si(ee)))
		),
		patch_length: t('patch_length', 'any, any, any', (f, er, h) =>
			metres(fam.patchLength(si(f), si(er), si(h)))
		),
		te11_cutoff: t('te11_cutoff', 'any', (d) => hertz(fam.te11Cutoff(si(d)))),
		tm01_cutoff: t('tm01_cutoff', 'any', (d) => hertz(fam.tm01Cutoff(si(d)))),
		guide_wavelength: t('guide_wavelength', 'any, any', (f, d) =>
			metres(fam.guideWavelength(si(f), si(d)))
		),
		vf_from_er: t('vf_from_er', 'any', (er) => fam.vfFromEr(si(er))),
		lambda_in: t('lambda_in', 'any, any', (f, vf) => metres(fam.lambdaIn(si(f), si(vf)))),
		vswr_from_rl: t('vswr_from_rl', 'any', (rl) => fam.vswrFromRl(si(rl))),
		rl_from_vswr: t('rl_from_vswr', 'any', (v) => fam.rlFromVswr(si(v))),
		gamma_from_vswr: t('gamma_from_vswr', 'any', (v) => fam.gammaFromVswr(si(v))),
		mismatch_loss: t('mismatch_loss', 'any', (v) => fam.mismatchLoss(si(v))),
		snap: math.typed('snap', {
			'Unit, string': (x: Unit, id: string) => {
				if (!isCatalogueId(id)) throw new Error(`unknown catalogue ${id}`);
				return metres(snapValue(x.value as number, id));
			}
		})
	};
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

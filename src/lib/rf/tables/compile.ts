/**
 * compileTable: checks a definition, resolves parameter values, compiles every row once against the
 * parameters and earlier rows. Errors stay on their parameter or row; rows reading them report
 * "depends on <key>". Environment slots: 0 f, 1 lambda, 2 c, then parameters, then rows.
 */
import { isCatalogueId, type CatalogueId } from '../catalogues/stock';
import {
	KEY_PATTERN,
	MAX_PARAMETERS,
	MAX_ROWS,
	PARSER_WORDS,
	SCOPE_NAMES
} from '../formulas/limits';
import { compileFormula, type LocatedError } from '../formulas/formula';
import type { CompileScope, Compiled, ScopeEntry } from '../formulas/types';
import {
	ANGLE,
	DIMLESS,
	FREQUENCY,
	LENGTH,
	SPEED,
	describeDims,
	divDims,
	isDimless,
	sameDims,
	type Dims
} from '../formulas/dims';
import { FUNCTIONS, SPECIAL_FUNCTIONS } from '../formulas/functions';
import { unitLiteral } from '../formulas/sandbox';
import {
	TableInputError,
	type ParameterDef,
	type RowDef,
	type TableDefinition,
	type ValidRatio
} from './types';

const RESERVED: ReadonlySet<string> = new Set<string>([
	...SCOPE_NAMES,
	...PARSER_WORDS,
	...FUNCTIONS.keys(),
	...SPECIAL_FUNCTIONS
]);

/** Why a key cannot be used, or undefined. Unit names of lengths, frequencies and angles are kept. */
export function keyProblem(key: string): string | undefined {
	if (!KEY_PATTERN.test(key)) return 'a key is a letter or _ then up to 39 letters, digits or _';
	if (RESERVED.has(key)) return `"${key}" is a reserved name`;
	const u = unitLiteral(key);
	if (u && [LENGTH, FREQUENCY, ANGLE].some((d) => sameDims(d, u.dims))) {
		return `"${key}" is a unit name used in formulas`;
	}
	return undefined;
}

export interface CompiledRatio {
	slot: number;
	of: string;
	min: number;
	max: number;
}

interface CompiledParts {
	slot: number;
	dims: Dims;
	error?: LocatedError;
	ratio?: CompiledRatio;
	/** Set when valid_ratio could not be used; shown as a warning. */
	ratioNote?: string;
}

export interface CompiledParameter extends CompiledParts {
	def: ParameterDef;
	si: number;
}

export interface CompiledRow extends CompiledParts {
	def: RowDef;
	expr?: Compiled;
	deps: number[];
	catalogue?: CatalogueId;
	isLength: boolean;
}

export interface CompiledTable {
	parameters: CompiledParameter[];
	rows: CompiledRow[];
	slotKeys: string[];
	size: number;
}

function checkDefinition(def: TableDefinition): void {
	if (def.rows.length > MAX_ROWS) throw new TableInputError(`at most ${MAX_ROWS} rows`, 'rows');
	if (def.parameters.length > MAX_PARAMETERS) {
		throw new TableInputError(`at most ${MAX_PARAMETERS} parameters`, 'parameters');
	}
	const seen = new Set<string>();
	const check = (key: string, field: string) => {
		const problem = keyProblem(key);
		if (problem) throw new TableInputError(problem, field);
		if (seen.has(key)) throw new TableInputError(`duplicate key "${key}"`, field);
		seen.add(key);
	};
	def.parameters.forEach((p, i) => check(p.key, `parameters[${i}].key`));
	def.rows.forEach((r, i) => check(r.key, `rows[${i}].key`));
}

// Structural rows may also be plain ratios (unit ''); resonant rows get sensitivity only when lengths.
const KIND_DIMS: Record<RowDef['kind'], { allowed: Dims[]; words: string }> = {
	resonant: { allowed: [LENGTH, ANGLE], words: 'a length or an angle' },
	structural: { allowed: [LENGTH, ANGLE, DIMLESS], words: 'a length, an angle or a plain ratio' },
	material: { allowed: [LENGTH, ANGLE], words: 'a length or an angle' },
	count: { allowed: [DIMLESS], words: 'a plain number' }
};

function compileRatio(
	spec: ValidRatio,
	own: Dims,
	scope: CompileScope
): Pick<CompiledParts, 'ratio' | 'ratioNote'> {
	const entry = scope.lookup(spec.of);
	if (!entry)
		return {
			ratioNote: `valid_ratio ignored: "${spec.of}" is not a parameter, an earlier row, f or lambda`
		};
	if (!isDimless(divDims(own, entry.dims))) {
		return {
			ratioNote: `valid_ratio ignored: this is ${describeDims(own)} but ${spec.of} is ${describeDims(entry.dims)}`
		};
	}
	return { ratio: { slot: entry.slot, of: spec.of, min: spec.min, max: spec.max } };
}

export function compileTable(def: TableDefinition): CompiledTable {
	checkDefinition(def);
	const entries = new Map<string, ScopeEntry>([
		['f', { slot: 0, dims: FREQUENCY }],
		['lambda', { slot: 1, dims: LENGTH }],
		['c', { slot: 2, dims: SPEED }]
	]);
	const broken = new Set<string>();
	const rowIndex = new Map(def.rows.map((r, i) => [r.key, i]));
	const slotKeys = ['f', 'lambda', 'c'];
	const valueScope: CompileScope = {
		lookup: () => undefined,
		refuse: (name) =>
			entries.has(name) || def.parameters.some((p) => p.key === name)
				? `a parameter value is a number with an optional unit, like "1.6 mm"; it cannot use ${name}`
				: undefined
	};
	const parameters = def.parameters.map((p): CompiledParameter => {
		const slot = slotKeys.push(p.key) - 1;
		const out: CompiledParameter = { def: p, slot, si: NaN, dims: DIMLESS };
		if (typeof p.value === 'number') {
			out.si = p.value;
			if (!Number.isFinite(p.value)) out.error = { message: 'value must be a finite number' };
		} else {
			const r = compileFormula(p.value, valueScope);
			if (!r.ok) out.error = r.error;
			else if (r.expr.k === undefined || !Number.isFinite(r.expr.k))
				out.error = { message: 'value must be a finite number' };
			else [out.si, out.dims] = [r.expr.k, r.expr.dims];
		}
		if (out.error) broken.add(p.key);
		else entries.set(p.key, { slot, dims: out.dims });
		return out;
	});
	for (const p of parameters) {
		if (!p.error && p.def.valid_ratio)
			Object.assign(p, compileRatio(p.def.valid_ratio, p.dims, rowScope(p.def.key)));
	}
	function rowScope(self: string): CompileScope {
		return {
			lookup: (name) => entries.get(name),
			refuse: (name) => {
				if (name === self) return `row "${self}" refers to itself`;
				if (broken.has(name)) return `depends on ${name}`;
				const j = rowIndex.get(name);
				if (j !== undefined) {
					return `"${name}" is row ${j + 1}, defined later; a row may only use parameters and earlier rows`;
				}
				return undefined;
			}
		};
	}
	const rows = def.rows.map((r): CompiledRow => {
		const slot = slotKeys.push(r.key) - 1;
		const out: CompiledRow = { def: r, slot, dims: DIMLESS, deps: [], isLength: false };
		const scope = rowScope(r.key);
		const compiled = compileFormula(r.formula, scope);
		if (!compiled.ok) out.error = compiled.error;
		else {
			const { expr, deps } = compiled;
			const kind = KIND_DIMS[r.kind];
			if (!kind) out.error = { message: `unknown kind "${String(r.kind)}"` };
			else if (!kind.allowed.some((d) => sameDims(d, expr.dims))) {
				out.error = {
					message: `a ${r.kind} row must give ${kind.words}, but this gives ${describeDims(expr.dims)}`
				};
			} else if (r.catalogue !== undefined && !isCatalogueId(r.catalogue)) {
				out.error = { message: `unknown catalogue "${String(r.catalogue)}"` };
			} else if (r.catalogue !== undefined && !sameDims(expr.dims, LENGTH)) {
				out.error = {
					message: `catalogue ${r.catalogue} needs a length, but this gives ${describeDims(expr.dims)}`
				};
			} else {
				Object.assign(out, {
					expr,
					dims: expr.dims,
					deps: [...deps],
					catalogue: r.catalogue,
					isLength: sameDims(expr.dims, LENGTH)
				});
			}
		}
		if (out.error) broken.add(r.key);
		else {
			if (r.valid_ratio) Object.assign(out, compileRatio(r.valid_ratio, out.dims, scope));
			entries.set(r.key, { slot, dims: out.dims });
		}
		return out;
	});
	return { parameters, rows, slotKeys, size: slotKeys.length };
}

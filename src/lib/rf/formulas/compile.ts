/**
 * Translates a whitelisted mathjs AST into a closure over plain SI numbers, checking dimensions on
 * the way. Constants, unit literals and constant sub-expressions are folded at compile time, so an
 * evaluation is a few array reads and float operations. Node types and functions not listed here
 * are rejected (a whitelist, not a blacklist).
 */
import type { MathNode } from 'mathjs';
import { isCatalogueId, snapValue } from '../catalogues/stock';
import {
	DIMLESS,
	LENGTH,
	describeDims,
	divDims,
	isDimless,
	mulDims,
	powDims,
	sameDims,
	type Dims
} from './dims';
import { CONSTANTS, FUNCTIONS, FormulaRuntimeError } from './functions';
import { COMPARE, REJECTED, isUnitOnly, type AnyNode } from './nodes';
import { isMathName, unitLiteral } from './sandbox';
import type { Compiled, CompileScope, Run } from './types';

/** A compile error with the 1-based column it points at, when known. */
export class FormulaError extends Error {
	constructor(
		message: string,
		readonly column?: number
	) {
		super(message);
	}
}

export interface CompileContext {
	scope: CompileScope;
	deps: Set<number>;
	columnOf(node: MathNode): number | undefined;
}

const EMPTY = new Float64Array(0);

const konst = (k: number, dims: Dims): Compiled => ({ dims, k, run: () => k });

export function compileNode(node: MathNode, ctx: CompileContext): Compiled {
	const fail = (message: string, at: MathNode = node): never => {
		throw new FormulaError(message, ctx.columnOf(at));
	};
	/** Folds the value when every part is constant; a runtime error then becomes a compile error. */
	const derive = (dims: Dims, run: Run, parts: Compiled[]): Compiled => {
		if (!parts.every((p) => p.k !== undefined)) return { dims, run };
		try {
			return konst(run(EMPTY), dims);
		} catch (e) {
			return fail(e instanceof FormulaRuntimeError ? e.message : String(e));
		}
	};
	const sub = (n: MathNode) => compileNode(n, ctx);
	const n = node as unknown as AnyNode;

	switch (n.type) {
		case 'ConstantNode': {
			if (typeof n.value === 'number' && Number.isFinite(n.value)) return konst(n.value, DIMLESS);
			if (typeof n.value === 'string') {
				return fail('text in quotes is only allowed as the catalogue name in snap(x, "awg")');
			}
			return fail(`${String(n.value)} is not allowed; use numbers and units`);
		}
		case 'ParenthesisNode':
			return sub(n.content as MathNode);
		case 'SymbolNode':
			return symbol(n.name as string, node, ctx, fail);
		case 'ConditionalNode': {
			const c = sub(n.condition as MathNode);
			const t = sub(n.trueExpr as MathNode);
			const e = sub(n.falseExpr as MathNode);
			if (!isDimless(c.dims)) fail('the condition of ? : must be a comparison or a plain number');
			if (!sameDims(t.dims, e.dims)) {
				fail(
					`both branches of ? : must be of one kind, got ${describeDims(t.dims)} and ${describeDims(e.dims)}`
				);
			}
			const [rc, rt, re] = [c.run, t.run, e.run];
			return derive(t.dims, (v) => (rc(v) !== 0 ? rt(v) : re(v)), [c, t, e]);
		}
		case 'OperatorNode':
			return operator(n, node, ctx, fail, derive);
		case 'FunctionNode':
			return call(n, node, ctx, fail, derive);
		default:
			return fail(REJECTED[n.type] ?? `${n.type} is not allowed in formulas`);
	}
}

type Fail = (message: string, at?: MathNode) => never;
type Derive = (dims: Dims, run: Run, parts: Compiled[]) => Compiled;

function symbol(name: string, node: MathNode, ctx: CompileContext, fail: Fail): Compiled {
	const entry = ctx.scope.lookup(name);
	if (entry) {
		ctx.deps.add(entry.slot);
		const s = entry.slot;
		return { dims: entry.dims, run: (env) => env[s] };
	}
	const refusal = ctx.scope.refuse(name);
	if (refusal) return fail(refusal, node);
	const k = CONSTANTS.get(name);
	if (k !== undefined) return konst(k, DIMLESS);
	const u = unitLiteral(name);
	if (u) {
		if (u.offset) fail(`unit ${name} has an offset (like degC) and cannot be used in formulas`);
		return konst(u.si, u.dims);
	}
	if (FUNCTIONS.has(name)) return fail(`${name} is a function; call it like ${name}(x)`);
	if (isMathName(name)) return fail(`${name} is not available in formulas`);
	return fail(`unknown name "${name}"`);
}

function powOp(base: Compiled, exp: Compiled, at: MathNode, fail: Fail, derive: Derive): Compiled {
	if (!isDimless(exp.dims))
		fail(`the exponent must be a plain number, got ${describeDims(exp.dims)}`, at);
	const rb = base.run;
	if (exp.k === undefined) {
		if (!isDimless(base.dims))
			fail('a quantity with a unit can only be raised to a fixed number', at);
		const re = exp.run;
		return derive(DIMLESS, (v) => Math.pow(rb(v), re(v)), [base, exp]);
	}
	const k = exp.k;
	const dims = powDims(base.dims, k);
	if (k === 2) return derive(dims, (v) => rb(v) * rb(v), [base]);
	if (k === 0.5) return derive(dims, (v) => Math.sqrt(rb(v)), [base]);
	return derive(dims, (v) => Math.pow(rb(v), k), [base]);
}

function operator(
	n: AnyNode,
	node: MathNode,
	ctx: CompileContext,
	fail: Fail,
	derive: Derive
): Compiled {
	const fn = n.fn as string;
	const args = n.args ?? [];
	const parts = args.map((a) => compileNode(a, ctx));
	const [a, b] = parts;
	const text = (i: number) => args[i].toString();
	if (fn === 'add' || fn === 'subtract') {
		if (!sameDims(a.dims, b.dims)) {
			const verb = fn === 'add' ? 'add' : 'subtract';
			fail(
				`cannot ${verb} ${describeDims(a.dims)} (${text(0)}) and ${describeDims(b.dims)} (${text(1)})`,
				args[1]
			);
		}
		const [ra, rb] = [a.run, b.run];
		const run: Run = fn === 'add' ? (v) => ra(v) + rb(v) : (v) => ra(v) - rb(v);
		return derive(a.dims, run, parts);
	}
	if (fn === 'multiply' && parts.length === 2) {
		const [ra, rb] = [a.run, b.run];
		return derive(mulDims(a.dims, b.dims), (v) => ra(v) * rb(v), parts);
	}
	if (fn === 'divide') {
		const [ra, rb] = [a.run, b.run];
		return derive(divDims(a.dims, b.dims), (v) => ra(v) / rb(v), parts);
	}
	if (fn === 'pow') return powOp(a, b, node, fail, derive);
	if (fn === 'unaryMinus') {
		const ra = a.run;
		return derive(a.dims, (v) => -ra(v), parts);
	}
	if (fn === 'unaryPlus') return a;
	if (fn === 'to') {
		if (!isUnitOnly(args[1], ctx.scope))
			fail(`the right side of ${n.op} must be a unit, like mm or in`, args[1]);
		if (!sameDims(a.dims, b.dims)) {
			fail(`cannot convert ${describeDims(a.dims)} (${text(0)}) to ${text(1)}`, args[1]);
		}
		return a;
	}
	const cmp = COMPARE[fn];
	if (cmp) {
		if (!sameDims(a.dims, b.dims)) {
			fail(
				`cannot compare ${describeDims(a.dims)} (${text(0)}) with ${describeDims(b.dims)} (${text(1)})`,
				args[1]
			);
		}
		const [ra, rb] = [a.run, b.run];
		return derive(DIMLESS, (v) => (cmp(ra(v), rb(v)) ? 1 : 0), parts);
	}
	if (fn === 'and' || fn === 'or' || fn === 'not') {
		if (!parts.every((p) => isDimless(p.dims))) fail(`${fn} needs comparisons or plain numbers`);
		const [ra, rb] = [a.run, b?.run];
		if (fn === 'not') return derive(DIMLESS, (v) => (ra(v) === 0 ? 1 : 0), parts);
		if (fn === 'and') return derive(DIMLESS, (v) => (ra(v) !== 0 && rb(v) !== 0 ? 1 : 0), parts);
		return derive(DIMLESS, (v) => (ra(v) !== 0 || rb(v) !== 0 ? 1 : 0), parts);
	}
	return fail(`operator ${n.op} is not allowed in formulas`);
}

function call(
	n: AnyNode,
	node: MathNode,
	ctx: CompileContext,
	fail: Fail,
	derive: Derive
): Compiled {
	const target = n.fn as AnyNode;
	if (target.type !== 'SymbolNode') return fail('only named functions can be called, like sqrt(x)');
	const name = target.name as string;
	const args = n.args ?? [];
	if (ctx.scope.lookup(name)) return fail(`${name} is a value, not a function`);
	if (name === 'pow') {
		if (args.length !== 2) fail(`pow takes 2 arguments, got ${args.length}`);
		return powOp(compileNode(args[0], ctx), compileNode(args[1], ctx), node, fail, derive);
	}
	if (name === 'snap') return snapCall(args, node, ctx, fail, derive);
	const spec = FUNCTIONS.get(name);
	if (!spec) {
		return fail(
			isMathName(name) ? `function ${name} is not allowed in formulas` : `unknown function ${name}`
		);
	}
	if (args.length < spec.min || args.length > spec.max) {
		const want = spec.min === spec.max ? `${spec.min}` : `${spec.min} to ${spec.max}`;
		fail(`${name} takes ${want} argument${spec.max === 1 ? '' : 's'}, got ${args.length}`);
	}
	const parts = args.map((a) => compileNode(a, ctx));
	const dims = spec.dims(parts.map((p, i) => ({ dims: p.dims, text: args[i].toString() })));
	if (typeof dims === 'string') return fail(dims);
	const f = spec.impl;
	const r = parts.map((p) => p.run);
	let run: Run;
	if (r.length === 1) run = (v) => f(r[0](v));
	else if (r.length === 2) run = (v) => f(r[0](v), r[1](v));
	else if (r.length === 3) run = (v) => f(r[0](v), r[1](v), r[2](v));
	else run = (v) => f(...r.map((x) => x(v)));
	return derive(dims, run, parts);
}

function snapCall(
	args: MathNode[],
	node: MathNode,
	ctx: CompileContext,
	fail: Fail,
	derive: Derive
): Compiled {
	const usage = 'snap takes a length and a catalogue name in quotes, like snap(d, "awg")';
	if (args.length !== 2) fail(usage);
	const idNode = args[1] as unknown as AnyNode;
	if (idNode.type !== 'ConstantNode' || typeof idNode.value !== 'string') fail(usage, args[1]);
	const id = idNode.value as string;
	if (!isCatalogueId(id)) fail(`unknown catalogue "${id}"`, node);
	const x = compileNode(args[0], ctx);
	if (!sameDims(x.dims, LENGTH)) fail(`snap needs a length, got ${describeDims(x.dims)}`, args[0]);
	const rx = x.run;
	return derive(LENGTH, (v) => snapValue(rx(v), id as Parameters<typeof snapValue>[1]), [x]);
}

/**
 * Formula front end: length check, mathjs parse (cached by formula text in a bounded LRU), source
 * columns for names, and compilation to a fast closure (formula-compile). Columns are 1-based.
 *
 * Syntax is mathjs's expression syntax with units (`lambda / 4`, `1.5 mm`, `sin(14 deg)`,
 * `(lambda / 4) to mm`). Only numbers, names, operators, parentheses, ? : and calls of the
 * allow-listed functions are accepted; mathjs never evaluates user text here, so evaluation is
 * bounded by the formula's size (≤ 500 characters, no loops, no matrices, no recursion).
 */
import { LRUCache } from 'lru-cache';
import type { MathNode } from 'mathjs';
import { MAX_FORMULA_LENGTH, PARSER_WORDS } from './limits';
import { compileNode, FormulaError } from './compile';
import type { CompileScope, Compiled } from './types';
import { parseExpression } from './sandbox';

export interface LocatedError {
	message: string;
	column?: number;
}

interface Parsed {
	node: MathNode;
	columns: Map<MathNode, number>;
}

type ParseEntry = Parsed | LocatedError;

const CACHE_LIMIT = 5000;
const cache = new LRUCache<string, ParseEntry>({ max: CACHE_LIMIT });
let parses = 0;
const WORDS: ReadonlySet<string> = new Set(PARSER_WORDS);

/** Names in source order with their 1-based columns, skipping strings, numbers and parser words. */
export function scanNames(text: string): { name: string; column: number }[] {
	const out: { name: string; column: number }[] = [];
	const re =
		/("(?:[^"\\]|\\.)*"?|'(?:[^'\\]|\\.)*'?)|(0[xbo][0-9a-f]+|(?:\d+\.?\d*|\.\d+)(?:e[+-]?\d+)?)|([\p{L}_$][\p{L}\p{N}_$]*)/giu;
	for (const m of text.matchAll(re)) {
		if (m[3] !== undefined && !WORDS.has(m[3]))
			out.push({ name: m[3], column: (m.index ?? 0) + 1 });
	}
	return out;
}

/** Pairs each SymbolNode with its column when the AST's names match the source's names in order. */
function mapColumns(text: string, node: MathNode): Map<MathNode, number> {
	const symbols: MathNode[] = [];
	node.traverse((n) => {
		if (n.type === 'SymbolNode') symbols.push(n);
	});
	const names = scanNames(text);
	const columns = new Map<MathNode, number>();
	const aligned =
		names.length === symbols.length &&
		symbols.every((s, i) => (s as unknown as { name: string }).name === names[i].name);
	symbols.forEach((s, i) => {
		const name = (s as unknown as { name: string }).name;
		const column = aligned ? names[i].column : names.find((x) => x.name === name)?.column;
		if (column !== undefined) columns.set(s, column);
	});
	return columns;
}

function parseUncached(text: string): ParseEntry {
	if (text.length > MAX_FORMULA_LENGTH) {
		return { message: `formula is ${text.length} characters; the limit is ${MAX_FORMULA_LENGTH}` };
	}
	if (text.trim() === '') return { message: 'formula is empty' };
	try {
		const node = parseExpression(text);
		return { node, columns: mapColumns(text, node) };
	} catch (e) {
		const err = e as { message?: string; char?: number };
		const message = String(err.message ?? e).replace(/\s*\(char \d+\)$/, '');
		return {
			message: `syntax error: ${message}`,
			column: typeof err.char === 'number' ? err.char : undefined
		};
	}
}

/** Parsed AST for a formula text, from the LRU cache when seen before. */
function parseFormula(text: string): ParseEntry {
	const hit = cache.get(text);
	if (hit) return hit;
	parses++;
	const entry = parseUncached(text);
	cache.set(text, entry);
	return entry;
}

/** Cache size and how many texts were parsed so far (a parse happens only on a cache miss). */
export function formulaCacheStats(): { size: number; parses: number; limit: number } {
	return { size: cache.size, parses, limit: CACHE_LIMIT };
}

export type CompileResult =
	{ ok: true; expr: Compiled; deps: Set<number> } | { ok: false; error: LocatedError };

/** Compiles a formula against a scope; `deps` are the scope slots it reads. */
export function compileFormula(text: string, scope: CompileScope): CompileResult {
	const parsed = parseFormula(text);
	if (!('node' in parsed)) return { ok: false, error: parsed };
	const deps = new Set<number>();
	const columnOf = (at: MathNode): number | undefined => {
		let column: number | undefined;
		at.traverse((n) => {
			if (column === undefined) column = parsed.columns.get(n);
		});
		return column;
	};
	try {
		return { ok: true, expr: compileNode(parsed.node, { scope, deps, columnOf }), deps };
	} catch (e) {
		if (e instanceof FormulaError) {
			return {
				ok: false,
				error:
					e.column === undefined ? { message: e.message } : { message: e.message, column: e.column }
			};
		}
		// Anything else is a bug in the compiler, still reported on the row rather than thrown.
		return { ok: false, error: { message: `cannot compile formula: ${String(e)}` } };
	}
}

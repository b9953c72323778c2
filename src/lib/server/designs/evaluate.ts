/**
 * POST /api/v1/evaluate's work: validate, compile and evaluate a client's table. A table that was
 * validated and compiled before is found by its JSON (see tableKey), so a client retyping the
 * frequency pays only for evaluation (the table is parsed and checked once, not per keystroke).
 */
import {
	parseEvaluateOptions,
	parseEvaluateRequest,
	toTableInput
} from '$lib/rf/tables/evaluate-request';
import {
	compileTable,
	evaluateTable,
	TableInputError,
	type CompiledTable,
	type TableResult
} from '$lib/rf/tables/table';
import { DomainError } from '../http/errors';
import { hashKey } from '../http/hash';
import { LRUCache } from 'lru-cache';

const compiledTables = new LRUCache<string, CompiledTable>({ max: 256 });

/**
 * The key of the table part of a body (what it says, not how it is spaced); null if not an object.
 * Usual tables (a few kB) are their own key, which the map compares whole; only large ones are hashed.
 */
function tableKey(body: unknown): string | null {
	if (typeof body !== 'object' || body === null || Array.isArray(body)) return null;
	const { parameters, rows } = body as Record<string, unknown>;
	const text = JSON.stringify([parameters ?? null, rows ?? null]);
	return text.length <= 16_384 ? text : hashKey(text);
}

/** @throws DomainError(400) naming the field for anything wrong with the body. */
export function evaluateBody(body: unknown): TableResult {
	const key = tableKey(body);
	const known = key ? compiledTables.get(key) : undefined;
	const options = known ? parseEvaluateOptions(body) : null;
	try {
		if (known && options) return evaluateTable(known, options);
		const parsed = parseEvaluateRequest(body);
		if (!parsed.ok) throw new DomainError(400, parsed.error.message, parsed.error.field);
		const input = toTableInput(parsed.value);
		const compiled = compileTable(input.definition);
		if (key) compiledTables.set(key, compiled);
		return evaluateTable(compiled, input.options);
	} catch (e) {
		if (e instanceof TableInputError) throw new DomainError(400, e.message, e.field);
		throw e;
	}
}

import { z } from '../../zod';
import { MAX_FORMULA_CHARS, MAX_ITEMS, MAX_LOADS, MAX_NAME_CHARS } from './limits';
import type { ModelIssue, ModelResult, ModelTemplate, Scalar, WireModel } from './types';
import { labelFor } from './validate';

/**
 * Reads a wire model from untrusted JSON-like input: the evaluated form (every scalar a finite
 * number) or the template form the design file keeps (a scalar may be a formula string). Shapes
 * are checked here; value ranges and geometry in validate.ts. A failure names the wire and field.
 */

type ScalarSchema = z.ZodType<number> | z.ZodType<Scalar>;

function schemas(scalar: ScalarSchema) {
	const vec = z.tuple([scalar, scalar, scalar]);
	const common = { name: z.string().trim().min(1).max(MAX_NAME_CHARS).optional(), radius: scalar };
	const plane = z.enum(['xy', 'yz', 'zx']);
	const items = {
		wire: z.strictObject({
			kind: z.literal('wire').optional(),
			...common,
			from: vec,
			to: vec,
			segments: scalar.optional()
		}),
		arc: z.strictObject({
			kind: z.literal('arc'),
			...common,
			centre: vec,
			plane,
			arc_radius: scalar,
			start_deg: scalar,
			end_deg: scalar,
			pieces: scalar
		}),
		helix: z.strictObject({
			kind: z.literal('helix'),
			...common,
			base: vec,
			axis: z.enum(['x', 'y', 'z']),
			turns: scalar,
			pitch: scalar,
			helix_radius: scalar,
			pieces_per_turn: scalar,
			hand: z.enum(['right', 'left']),
			start_deg: scalar.optional()
		}),
		plate: z.strictObject({
			kind: z.literal('plate'),
			...common,
			shape: z.enum(['rectangle', 'disc']),
			centre: vec,
			plane,
			width: scalar.optional(),
			height: scalar.optional(),
			diameter: scalar.optional(),
			mesh: scalar
		})
	};
	const ref = z.union([z.string().min(1).max(MAX_NAME_CHARS), z.number().int().min(1)]);
	const point = { wire: ref, position: scalar };
	const load = z.strictObject({
		...point,
		arrangement: z.enum(['series', 'parallel']),
		r_ohm: scalar.optional(),
		l_h: scalar.optional(),
		c_f: scalar.optional()
	});
	const model = z.strictObject({
		wires: z.array(z.unknown()).min(1).max(MAX_ITEMS),
		feed: z.strictObject(point),
		loads: z.array(load).max(MAX_LOADS).optional(),
		ground: z.boolean().optional(),
		conductivity_s_per_m: scalar.nullable().optional()
	});
	return { items, model };
}

const numberSchemas = schemas(z.number());
const templateSchemas = schemas(
	z.union([z.number(), z.string().trim().min(1).max(MAX_FORMULA_CHARS)])
);

const FIELD_WORDS: Record<string, string> = {
	from: 'from',
	to: 'to',
	base: 'base',
	centre: 'centre'
};
const AXIS = ['x', 'y', 'z'];

/** 'from z', 'radius', 'loads 2 position' — the field a path points at, in words. */
export function fieldWords(path: (string | number)[]): string {
	const out: string[] = [];
	for (let i = 0; i < path.length; i++) {
		const k = path[i];
		if (typeof k === 'number')
			out.push(i > 0 && FIELD_WORDS[String(path[i - 1])] ? (AXIS[k] ?? String(k)) : String(k + 1));
		else out.push(k.replace(/_/g, ' '));
	}
	return out.join(' ');
}

export const pathText = (path: (string | number)[]) =>
	path.reduce<string>((s, k) => (typeof k === 'number' ? `${s}[${k}]` : s ? `${s}.${k}` : k), '');

const EXPECTED: Record<string, string> = {
	number: 'a finite number',
	array: 'a list',
	object: 'an object',
	string: 'text',
	boolean: 'true or false'
};

/** A zod issue in words, for a message that names its field first. */
export function describeIssue(issue: z.core.$ZodIssue): string {
	const last = issue.path[issue.path.length - 1];
	if (typeof last === 'string' && FIELD_WORDS[last] && issue.code !== 'unrecognized_keys')
		return 'must be a list [x, y, z] of three values';
	switch (issue.code) {
		case 'invalid_type':
			return `must be ${EXPECTED[issue.expected] ?? `a ${issue.expected}`}`;
		case 'unrecognized_keys':
			return `unknown field${issue.keys.length > 1 ? 's' : ''} ${issue.keys.map((k) => `"${k.slice(0, 40)}"`).join(', ')}`;
		case 'invalid_value':
			return `must be one of ${issue.values.map((v) => JSON.stringify(v)).join(', ')}`;
		case 'too_big':
			return issue.origin === 'array'
				? `may hold at most ${issue.maximum} entries`
				: issue.origin === 'string'
					? `may be at most ${issue.maximum} characters long`
					: `must be at most ${issue.maximum}`;
		case 'too_small':
			return issue.origin === 'array'
				? `must hold at least ${issue.minimum} ${issue.minimum === 1 ? 'entry' : 'entries'}`
				: issue.origin === 'string'
					? 'must not be empty'
					: `must be at least ${issue.minimum}`;
		case 'invalid_union':
			return 'must be a number or a formula';
		default:
			return issue.message;
	}
}

function firstIssue(error: z.ZodError, prefix: (string | number)[], label: string): ModelIssue {
	const issue = error.issues[0];
	const path = [
		...prefix,
		...issue.path.filter((k): k is string | number => typeof k !== 'symbol')
	];
	const field = fieldWords(issue.path.filter((k): k is string | number => typeof k !== 'symbol'));
	const item = prefix[0] === 'wires' && typeof prefix[1] === 'number' ? prefix[1] : undefined;
	return {
		message: `${label}${field ? `${label ? ', ' : ''}${field}` : ''}: ${describeIssue(issue)}`,
		path: pathText(path),
		...(item !== undefined ? { item } : {})
	};
}

const KINDS = ['wire', 'arc', 'helix', 'plate'] as const;

function read<T>(input: unknown, s: ReturnType<typeof schemas>): ModelResult<T> {
	if (typeof input !== 'object' || input === null || Array.isArray(input))
		return {
			ok: false,
			error: { message: 'the model must be an object with wires and a feed', path: '' }
		};
	const top = s.model.safeParse(input);
	if (!top.success) return { ok: false, error: firstIssue(top.error, [], 'model') };
	const wires: unknown[] = [];
	for (let i = 0; i < top.data.wires.length; i++) {
		const raw = top.data.wires[i];
		const kind =
			typeof raw === 'object' && raw !== null && 'kind' in raw
				? (raw as { kind: unknown }).kind
				: 'wire';
		const word = KINDS.includes(kind as (typeof KINDS)[number])
			? (kind as (typeof KINDS)[number])
			: null;
		const name =
			typeof raw === 'object' && raw !== null ? (raw as { name?: unknown }).name : undefined;
		if (!word)
			return {
				ok: false,
				error: {
					message: `${labelFor('wire', i, name)}: kind must be one of "wire", "arc", "helix", "plate"`,
					path: `wires[${i}].kind`,
					item: i
				}
			};
		const r = s.items[word].safeParse(raw);
		if (!r.success)
			return { ok: false, error: firstIssue(r.error, ['wires', i], labelFor(word, i, name)) };
		wires.push({ ...r.data, kind: word });
	}
	return { ok: true, value: { ...top.data, wires } as T, warnings: [] };
}

/** The evaluated form: every scalar a finite number (API input). */
export function parseModel(input: unknown): ModelResult<WireModel> {
	return read<WireModel>(input, numberSchemas);
}

/** The template form: a scalar may be a formula string (design files). */
export function parseModelTemplate(input: unknown): ModelResult<ModelTemplate> {
	return read<ModelTemplate>(input, templateSchemas);
}

/** Keys whose string values are words, not formulas. */
const WORD_KEYS = new Set([
	'name',
	'kind',
	'plane',
	'axis',
	'hand',
	'shape',
	'arrangement',
	'wire'
]);

/**
 * Evaluates every formula in a parsed template with `evaluate` (which returns a number in SI
 * units, or a message); the first failure names the wire and field.
 */
export function evaluateModelTemplate(
	t: ModelTemplate,
	evaluate: (formula: string, path: string) => number | { error: string }
): ModelResult<WireModel> {
	let failure: ModelIssue | null = null;
	const walk = (v: unknown, path: (string | number)[]): unknown => {
		if (failure) return v;
		if (Array.isArray(v)) return v.map((x, i) => walk(x, [...path, i]));
		if (typeof v === 'object' && v !== null) {
			const o: Record<string, unknown> = {};
			for (const [k, x] of Object.entries(v)) o[k] = WORD_KEYS.has(k) ? x : walk(x, [...path, k]);
			return o;
		}
		if (typeof v !== 'string') return v;
		const r = evaluate(v, pathText(path));
		if (typeof r === 'number' && Number.isFinite(r)) return r;
		const item = path[0] === 'wires' && typeof path[1] === 'number' ? path[1] : undefined;
		const where =
			item !== undefined
				? `${labelFor(t.wires[item].kind, item, t.wires[item].name)}, ${fieldWords(path.slice(2))}`
				: fieldWords(path);
		failure = {
			message: `${where}: ${typeof r === 'number' ? 'the formula does not give a finite number' : r.error}`,
			path: pathText(path),
			...(item !== undefined ? { item } : {})
		};
		return v;
	};
	const value = walk(t, []) as WireModel;
	return failure ? { ok: false, error: failure } : { ok: true, value, warnings: [] };
}

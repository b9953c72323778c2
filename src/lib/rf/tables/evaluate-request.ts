/**
 * Validation of a POST /api/v1/evaluate body (zod 4). Returns the first problem with the field it
 * is in, written like `rows[3].kind`, and never throws for anything a client can send.
 */
import { z } from '../../zod';
import { CATALOGUE_IDS } from '../catalogues/stock';
import { MAX_FORMULA_LENGTH, MAX_PARAMETERS, MAX_ROWS } from '../formulas/limits';
import { MAX_FREQUENCY_HZ } from '../units/frequency';
import { keyProblem } from './compile';
import { ROW_KINDS, type EvaluateOptions, type TableDefinition } from './types';

const key = z.string({ error: 'key must be a string' }).superRefine((k, ctx) => {
	const problem = keyProblem(k);
	if (problem) ctx.addIssue({ code: 'custom', message: problem });
});

const validRatio = z
	.object({
		of: z.string().min(1).max(40).default('lambda'),
		min: z.number({ error: 'min must be a finite number' }),
		max: z.number({ error: 'max must be a finite number' })
	})
	.refine((v) => v.min <= v.max, { message: 'min must not exceed max', path: ['max'] });

const label = z.string().max(200, { error: 'label is at most 200 characters' }).optional();

const parameter = z.object({
	key,
	label,
	value: z.union([z.number(), z.string().max(MAX_FORMULA_LENGTH)], {
		error: `value must be a finite number or a string of at most ${MAX_FORMULA_LENGTH} characters, like "1.6 mm"`
	}),
	valid_ratio: validRatio.optional()
});

const row = z.object({
	key,
	label,
	formula: z
		.string({ error: 'formula must be a string' })
		.max(MAX_FORMULA_LENGTH, { error: `formula is at most ${MAX_FORMULA_LENGTH} characters` }),
	kind: z.enum(ROW_KINDS, {
		error: `kind must be one of ${ROW_KINDS.join(', ')}`
	}),
	catalogue: z
		.enum(CATALOGUE_IDS, { error: `catalogue must be one of ${CATALOGUE_IDS.join(', ')}` })
		.optional(),
	tolerance_mm: z.number().positive({ error: 'tolerance_mm must be a positive number' }).optional(),
	valid_ratio: validRatio.optional()
});

const frequency = z
	.number({ error: 'frequency_hz must be a finite number in Hz' })
	.positive({ error: 'frequency_hz must be above 0' })
	.max(MAX_FREQUENCY_HZ, { error: 'frequency_hz must be at most 1 THz (1e12 Hz)' });

const bandHz = z
	.tuple([frequency, frequency], { error: 'band_hz must be [low, high] in Hz' })
	.refine(([lo, hi]) => lo < hi, { message: 'band_hz low edge must be below the high edge' })
	.optional();

const units = z
	.enum(['mm', 'in', 'in_frac'], { error: 'units must be mm, in or in_frac' })
	.optional();

/** The fields of a request besides the table: what changes from one call to the next. */
const optionsSchema = z.object(
	{ frequency_hz: frequency, band_hz: bandHz, units },
	{ error: 'the body must be a JSON object' }
);

const requestSchema = z
	.object(
		{
			frequency_hz: frequency,
			parameters: z
				.array(parameter)
				.max(MAX_PARAMETERS, { error: `at most ${MAX_PARAMETERS} parameters` })
				.default([]),
			rows: z
				.array(row, { error: 'rows must be a list' })
				.max(MAX_ROWS, { error: `at most ${MAX_ROWS} rows` }),
			band_hz: bandHz,
			units
		},
		{ error: 'the body must be a JSON object' }
	)
	.superRefine((req, ctx) => {
		const seen = new Set<string>();
		const keys = [
			...req.parameters.map((p, i) => [p.key, ['parameters', i, 'key']] as const),
			...req.rows.map((r, i) => [r.key, ['rows', i, 'key']] as const)
		];
		for (const [k, path] of keys) {
			if (seen.has(k))
				ctx.addIssue({ code: 'custom', message: `duplicate key "${k}"`, path: [...path] });
			seen.add(k);
		}
	});

export type EvaluateRequest = z.infer<typeof requestSchema>;

export type ParseResult =
	{ ok: true; value: EvaluateRequest } | { ok: false; error: { message: string; field: string } };

/** `['rows', 3, 'kind']` → `rows[3].kind`. */
function fieldName(path: readonly PropertyKey[]): string {
	let out = '';
	for (const part of path) {
		if (typeof part === 'number') out += `[${part}]`;
		else out += out === '' ? String(part) : `.${String(part)}`;
	}
	return out === '' ? 'body' : out;
}

export function parseEvaluateRequest(body: unknown): ParseResult {
	const r = requestSchema.safeParse(body);
	if (r.success) return { ok: true, value: r.data };
	const issue = r.error.issues[0];
	return { ok: false, error: { message: issue.message, field: fieldName(issue.path) } };
}

function toOptions(req: z.infer<typeof optionsSchema>): EvaluateOptions {
	const options: EvaluateOptions = { frequencyHz: req.frequency_hz };
	if (req.band_hz) options.bandHz = [req.band_hz[0], req.band_hz[1]];
	if (req.units) options.units = req.units;
	return options;
}

/** The engine's inputs from a validated request. */
export function toTableInput(req: EvaluateRequest): {
	definition: TableDefinition;
	options: EvaluateOptions;
} {
	return { definition: { parameters: req.parameters, rows: req.rows }, options: toOptions(req) };
}

/**
 * Only the options of a request whose table was validated before (a client retyping the
 * frequency sends the same table again). Null when they are not valid: parse the whole body then,
 * so the error names the first bad field as usual.
 */
export function parseEvaluateOptions(body: unknown): EvaluateOptions | null {
	const r = optionsSchema.safeParse(body);
	return r.success ? toOptions(r.data) : null;
}

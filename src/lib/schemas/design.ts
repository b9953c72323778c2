/** Shared zod schemas for a design and one revision's content (forms, API routes, design files). */
import { z } from '../zod';
import { MAX_FREQUENCY_HZ } from '../rf/units/frequency';

export const FAMILY_VALUES = [
	'dipole',
	'ground_plane',
	'yagi_uda',
	'helical',
	'patch',
	'biquad',
	'short_backfire',
	'cloverleaf',
	'waveguide_feed',
	'loop',
	'other'
] as const;
export type Family = (typeof FAMILY_VALUES)[number];

const FAMILY_LABELS: Record<Family, string> = {
	dipole: 'Dipole',
	ground_plane: 'Ground plane',
	yagi_uda: 'Yagi–Uda',
	helical: 'Helical',
	patch: 'Patch',
	biquad: 'Biquad',
	short_backfire: 'Short backfire',
	cloverleaf: 'Cloverleaf',
	waveguide_feed: 'Cantenna / waveguide feed',
	loop: 'Loop',
	other: 'Other'
};
export const FAMILIES: readonly { value: Family; label: string }[] = FAMILY_VALUES.map((value) => ({
	value,
	label: FAMILY_LABELS[value]
}));

export const POLARIZATION_VALUES = ['linear', 'lhcp', 'rhcp'] as const;
export type Polarization = (typeof POLARIZATION_VALUES)[number];
export const POLARIZATIONS: readonly { value: Polarization; label: string }[] = [
	{ value: 'linear', label: 'Linear' },
	{ value: 'lhcp', label: 'LHCP' },
	{ value: 'rhcp', label: 'RHCP' }
];

export const ROW_KINDS = ['resonant', 'structural', 'material', 'count'] as const;
export type RowKindValue = (typeof ROW_KINDS)[number];

export const DESIGN_LIMITS = {
	rows: 200,
	parameters: 100,
	formulaChars: 500,
	notesBytes: 200 * 1024,
	titleChars: 120,
	summaryChars: 500,
	labelChars: 120,
	changeNoteChars: 2000,
	maxFrequencyHz: MAX_FREQUENCY_HZ
} as const;

const KEY_PATTERN = /^[a-z_][a-z0-9_]{0,39}$/;
/** Names the formula evaluator defines itself; a parameter or row may not shadow them. */
const RESERVED_KEYS: readonly string[] = ['f', 'lambda', 'c', 'pi', 'e', 'i'];

/** "is required" for a missing field, otherwise what was expected. */
const expected = (what: string) => ({
	error: (issue: { input?: unknown }) =>
		issue.input === undefined ? 'is required' : `must be ${what}`
});

const key = z
	.string(expected('text'))
	.regex(KEY_PATTERN, {
		error: 'must start with a lower-case letter or _, then up to 39 of a–z, 0–9, _'
	})
	.refine((k) => !RESERVED_KEYS.includes(k), {
		error: 'is a reserved name (f, lambda, c, pi, e, i)'
	});

const text = (max: number, min = 0) =>
	z
		.string(expected('text'))
		.trim()
		.min(min, { error: min === 1 ? 'is required' : `needs at least ${min} characters` })
		.max(max, { error: `must be at most ${max} characters` });

const finite = z.number(expected('a finite number'));
const unit = text(16);

/** Range of dimension / wavelength the author measured; outside it the page warns. */
const validRatio = z
	.tuple([finite.positive(), finite.positive()], { error: 'must be [low, high]' })
	.refine(([lo, hi]) => lo < hi, { error: 'low must be below high' });

const parameterSchema = z.strictObject({
	key,
	label: text(DESIGN_LIMITS.labelChars, 1),
	value: finite,
	unit: unit.optional(),
	valid_ratio: validRatio.optional()
});

const rowSchema = z.strictObject({
	key,
	label: text(DESIGN_LIMITS.labelChars, 1),
	formula: text(DESIGN_LIMITS.formulaChars, 1),
	kind: z.enum(ROW_KINDS, { error: `must be one of ${ROW_KINDS.join(', ')}` }),
	catalogue: z
		.string()
		.regex(KEY_PATTERN, { error: 'must be a catalogue id such as awg or iso7089' })
		.optional(),
	tolerance_mm: finite.positive({ error: 'must be above 0' }).max(1000).optional(),
	valid_ratio: validRatio.optional(),
	unit: unit.optional()
});

const hz = finite
	.positive({ error: 'must be above 0 Hz' })
	.max(DESIGN_LIMITS.maxFrequencyHz, { error: 'must be at most 1 THz' });

const claimSchema = z
	.strictObject({
		centre_hz: hz,
		band_lo_hz: hz,
		band_hi_hz: hz,
		vswr_max: finite.min(1, { error: 'VSWR cannot be below 1' }).max(100),
		gain_dbi: finite.min(-50).max(60).optional(),
		gain_verified: z.boolean(expected('true or false')).optional()
	})
	.superRefine((claim, ctx) => {
		if (claim.band_lo_hz >= claim.band_hi_hz) {
			ctx.addIssue({ code: 'custom', path: ['band_hi_hz'], message: 'must be above band_lo_hz' });
		} else if (claim.centre_hz < claim.band_lo_hz || claim.centre_hz > claim.band_hi_hz) {
			ctx.addIssue({ code: 'custom', path: ['centre_hz'], message: 'must lie inside the band' });
		}
	});

export const designMetaSchema = z.strictObject({
	title: text(DESIGN_LIMITS.titleChars, 1),
	slug: z
		.string()
		.regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, { error: 'must be lower-case words joined by -' })
		.max(80)
		.optional(),
	family: z.enum(FAMILY_VALUES, { error: `must be one of ${FAMILY_VALUES.join(', ')}` }),
	polarization: z.enum(POLARIZATION_VALUES, { error: 'must be linear, lhcp or rhcp' }),
	summary: text(DESIGN_LIMITS.summaryChars)
});

const utf8Bytes = (s: string) => new TextEncoder().encode(s).length;

export const revisionContentSchema = z
	.strictObject({
		design_frequency_hz: hz,
		parameters: z
			.array(parameterSchema)
			.max(DESIGN_LIMITS.parameters, { error: `at most ${DESIGN_LIMITS.parameters} parameters` }),
		rows: z
			.array(rowSchema)
			.min(1, { error: 'needs at least one row' })
			.max(DESIGN_LIMITS.rows, { error: `at most ${DESIGN_LIMITS.rows} rows` }),
		claim: claimSchema,
		change_note: text(DESIGN_LIMITS.changeNoteChars),
		notes: z
			.string(expected('text'))
			.refine((s) => utf8Bytes(s) <= DESIGN_LIMITS.notesBytes, { error: 'must be at most 200 kB' })
	})
	.superRefine((content, ctx) => {
		// Formulas see parameters and earlier rows by key, so every key must be unique.
		const seen = new Set<string>();
		const visit = (list: 'parameters' | 'rows', items: { key: string }[]) =>
			items.forEach((item, i) => {
				if (seen.has(item.key)) {
					ctx.addIssue({
						code: 'custom',
						path: [list, i, 'key'],
						message: `"${item.key}" is used twice`
					});
				}
				seen.add(item.key);
			});
		visit('parameters', content.parameters);
		visit('rows', content.rows);
	});

export type DesignMeta = z.infer<typeof designMetaSchema>;
export type RevisionContent = z.infer<typeof revisionContentSchema>;

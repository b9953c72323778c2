/** Form fields of a measurement or build report upload, and of a photo upload (shared by page and server). */
import { z } from '../zod';
import { parseFrequency } from '$lib/rf/units/frequency';
import { CSV_QUANTITIES, FREQUENCY_UNITS, REFLECTION_PARAMETERS } from '$lib/rf/sweeps/types';

export const INSTRUMENTS = [
	{ value: 'vna', label: 'Vector network analyser' },
	{ value: 'scalar_sweeper', label: 'Scalar sweeper with directional coupler and detector' },
	{ value: 'antenna_analyser', label: 'Antenna analyser' }
] as const;
export type Instrument = (typeof INSTRUMENTS)[number]['value'];
const INSTRUMENT_VALUES = INSTRUMENTS.map((i) => i.value) as [Instrument, ...Instrument[]];

export const instrumentLabel = (v: string) => INSTRUMENTS.find((i) => i.value === v)?.label ?? v;

const MEASUREMENT_LIMITS = {
	referencePlaneChars: 200,
	notesChars: 4000,
	deviationsChars: 2000,
	materialsChars: 2000,
	captionChars: 300,
	fileNameChars: 120
} as const;

const text = (max: number) =>
	z
		.string()
		.trim()
		.max(max, { error: `must be at most ${max} characters` })
		.default('');

const optionalChoice = <T extends string>(values: readonly T[], what: string) =>
	z
		.string()
		.trim()
		.transform((v) => (v === '' ? undefined : v))
		.pipe(
			z
				.enum(values as [T, ...T[]], { error: `must be one of ${values.join(', ')} (${what})` })
				.optional()
		)
		.optional();

/** A calendar date YYYY-MM-DD, not after tomorrow (time zones), or empty. */
const measuredOn = z
	.string()
	.trim()
	.default('')
	.refine(
		(v) =>
			v === '' || (/^\d{4}-\d{2}-\d{2}$/.test(v) && !Number.isNaN(Date.parse(`${v}T00:00:00Z`))),
		{
			error: 'must be a date such as 2026-03-14'
		}
	)
	.refine((v) => v === '' || Date.parse(`${v}T00:00:00Z`) <= Date.now() + 86_400_000, {
		error: 'cannot be in the future'
	})
	.refine((v) => v === '' || v >= '1950-01-01', { error: 'must be after 1950' })
	.transform((v) => (v === '' ? null : v));

const z0 = z
	.string()
	.trim()
	.default('')
	.transform((v, ctx) => {
		if (v === '') return undefined;
		const x = /^\d+(\.\d+)?$/.test(v) ? Number(v) : NaN;
		if (!(x > 0 && x <= 10000)) {
			ctx.addIssue({ code: 'custom', message: 'must be a number of ohms above 0, e.g. 50' });
			return z.NEVER;
		}
		return x;
	});

export const measurementFormSchema = z.object({
	instrument: z.enum(INSTRUMENT_VALUES, { error: 'choose the instrument class' }),
	reference_plane: text(MEASUREMENT_LIMITS.referencePlaneChars),
	measured_on: measuredOn,
	notes: text(MEASUREMENT_LIMITS.notesChars),
	format: z
		.enum(['auto', 'touchstone', 'csv'], { error: 'must be auto, touchstone or csv' })
		.default('auto'),
	z0,
	column: text(100).transform((v) => (v === '' ? undefined : v)),
	quantity: optionalChoice(CSV_QUANTITIES, 'CSV quantity'),
	freq_unit: optionalChoice(FREQUENCY_UNITS, 'frequency unit'),
	parameter: optionalChoice(REFLECTION_PARAMETERS, 'the reflection read from a 2-port file')
});

/** "What I built": only for a build report on someone else's revision. */
export const buildReportSchema = z.object({
	target_frequency: z
		.string({ error: 'is required: the frequency you built for, e.g. 2.45 GHz' })
		.trim()
		.transform((v, ctx) => {
			const f = parseFrequency(v);
			if (!f.ok) {
				ctx.addIssue({ code: 'custom', message: f.message });
				return z.NEVER;
			}
			return f.hz;
		}),
	deviations: text(MEASUREMENT_LIMITS.deviationsChars),
	materials: text(MEASUREMENT_LIMITS.materialsChars)
});

const ATTACHMENT_KIND_VALUES = ['photo', 'sweep_image'] as const;

export const photoFormSchema = z.object({
	kind: z.enum(ATTACHMENT_KIND_VALUES, { error: 'must be photo or sweep_image' }).default('photo'),
	caption: text(MEASUREMENT_LIMITS.captionChars),
	keep_original: z
		.string()
		.optional()
		.transform((v) => v === 'on' || v === 'true' || v === '1')
});

/** The first problem as "field: message", for a form's one-line error. */
export function firstIssue(error: z.ZodError): { field: string; message: string } {
	const issue = error.issues[0];
	const field = String(issue?.path[0] ?? 'form');
	return { field, message: `${field.replace(/_/g, ' ')} ${issue?.message ?? 'is not valid'}` };
}

const field = z.string().max(20_000).optional();

/**
 * An upload form as posted (sweep or image): the file and the text fields a refused upload sends
 * back to refill the form. The fields are checked by measurementFormSchema, buildReportSchema or
 * photoFormSchema where the upload is stored.
 */
export const uploadFormSchema = z.object({
	file: z.instanceof(File).optional(),
	instrument: field,
	reference_plane: field,
	measured_on: field,
	notes: field,
	format: field,
	z0: field,
	column: field,
	quantity: field,
	freq_unit: field,
	parameter: field,
	target_frequency: field,
	deviations: field,
	materials: field,
	kind: field,
	caption: field,
	keep_original: field
});

export type UploadForm = z.infer<typeof uploadFormSchema>;

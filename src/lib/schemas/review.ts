/** Form schemas for peer review: verdicts, anchored comments, compare queries. */
import { z } from '../zod';

const VERDICT_VALUES = ['approve', 'revise', 'reject'] as const;
export type VerdictValue = (typeof VERDICT_VALUES)[number];

export const REVIEW_LIMITS = { commentChars: 20_000, summaryChars: 5_000 } as const;

export const reviewSchema = z.object({
	verdict: z.enum(VERDICT_VALUES, { error: 'Choose approve, revise or reject.' }),
	summary: z
		.string({ error: 'Write a summary.' })
		.trim()
		.min(1, { error: 'Write a summary of your review.' })
		.max(REVIEW_LIMITS.summaryChars, {
			error: `The summary must be at most ${REVIEW_LIMITS.summaryChars} characters.`
		})
});

const optionalInt = z
	.union([z.literal(''), z.coerce.number({ error: 'must be a whole number' })])
	.optional()
	.transform((v) => (v === '' || v === undefined ? undefined : v));

/** Raw comment form fields; anchor checks against the revision happen in comments.ts. */
export const commentFormSchema = z.object({
	body: z.string({ error: 'Write a comment.' }),
	anchor: z.enum(['general', 'row', 'lines']).default('general'),
	row_key: z.string().max(64).optional(),
	line_start: optionalInt,
	line_end: optionalInt,
	parent_id: z.string().max(64).optional()
});

export type CommentForm = z.infer<typeof commentFormSchema>;

/** The review form as posted; submitReview checks it with reviewSchema and names the field. */
export const verdictFormSchema = z.object({
	verdict: z.string().max(20).default(''),
	summary: z.string().default('')
});

export const resolveFormSchema = z.object({
	comment_id: z.string().max(64).default(''),
	resolved: z.string().max(1).default('1')
});

export const confirmRejectFormSchema = z.object({ review_id: z.string().max(64).default('') });

export type CommentAnchor =
	| { kind: 'general' }
	| { kind: 'row'; rowKey: string }
	| { kind: 'lines'; start: number; end: number };

/** Turns the flat form into an anchor; the numbers are validated against the notes later. */
export function anchorFromForm(form: CommentForm): CommentAnchor {
	if (form.anchor === 'row') return { kind: 'row', rowKey: (form.row_key ?? '').trim() };
	if (form.anchor === 'lines') {
		const start = form.line_start ?? NaN;
		return { kind: 'lines', start, end: form.line_end ?? start };
	}
	return { kind: 'general' };
}

/**
 * The one way a form action reads its post and says no: the body read once (a body that cannot be
 * parsed is the sender's problem, never a 500), checked with superforms against the form's zod
 * schema, and one mapping from an expected failure (a DomainError) to what the action returns.
 */
import { error, fail } from '@sveltejs/kit';
import { message, setError, superValidate, type SuperValidated } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import type { z } from '$lib/zod';
import { DomainError } from './errors';

/** adapter-node's body limit errors the stream with a 413 (a SvelteKitError) before any field is read. */
const statusOf = (e: unknown) => (e as { status?: unknown } | null)?.status;

async function formBody(request: Request): Promise<FormData> {
	try {
		return await request.formData();
	} catch (e) {
		// Cut off, a wrong boundary, or more than BODY_SIZE_LIMIT.
		if (statusOf(e) === 413) error(413, 'The form is larger than this server accepts.');
		error(400, 'The form could not be read; send it again.');
	}
}

/**
 * A form post read and checked against its schema; `files` lets file fields through. A body that
 * cannot be read ends the action with SvelteKit's error page: 400, or 413 past BODY_SIZE_LIMIT,
 * each with a message (an upload answers those itself, see isHttpError in upload-action.ts).
 */
export async function readForm<S extends z.ZodObject>(
	source: Request | FormData,
	schema: S,
	options: { files?: boolean } = {}
) {
	const data = source instanceof Request ? await formBody(source) : source;
	return superValidate(data, zod4(schema), { allowFiles: options.files ?? false });
}

/** The first problem of a form that did not validate: its field and the schema's message. */
export function firstProblem(form: SuperValidated<Record<string, unknown>>): {
	field: string | null;
	message: string;
} {
	for (const [field, messages] of Object.entries(form.errors)) {
		const text = Array.isArray(messages)
			? messages[0]
			: (messages as { _errors?: string[] })?._errors?.[0];
		if (text) return { field: field === '_errors' ? null : field, message: text };
	}
	return { field: null, message: 'Check the form and send it again.' };
}

/**
 * An expected failure as the action's answer: its status, message, field (and line and column for
 * an upload), plus what the page needs to refill the form. Anything else is a bug: thrown on, so
 * handleError logs it with an id.
 */
export function actionFailure<X extends Record<string, unknown>>(e: unknown, extra?: X) {
	if (!(e instanceof DomainError)) throw e;
	const said = e.toJSON() as { field?: string; line?: number; column?: number };
	const where = { field: said.field ?? null, line: said.line ?? null, column: said.column ?? null };
	return fail(e.status, { message: e.message, ...where, ...(extra ?? ({} as X)) });
}

/** The same for a superforms page: on the field the error names when the form has it, else the form's message. */
export function formFailure<T extends Record<string, unknown>>(
	form: SuperValidated<T>,
	e: unknown
) {
	if (!(e instanceof DomainError)) throw e;
	if (e.field && e.field in form.data) {
		return setError(form, e.field as never, e.message, { status: e.status });
	}
	return message(form, e.message, { status: e.status });
}

/**
 * The one way a form action reads its post and says no: superforms with the form's zod schema,
 * and one mapping from an expected failure (a DomainError) to what the action returns.
 */
import { fail } from '@sveltejs/kit';
import { message, setError, superValidate, type SuperValidated } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import type { z } from 'zod';
import { DomainError } from './errors';

/** A form post read and checked against its schema; `files` lets file fields through. */
export function readForm<S extends z.ZodObject>(
	source: Request | FormData,
	schema: S,
	options: { files?: boolean } = {}
) {
	return superValidate(source, zod4(schema), { allowFiles: options.files ?? false });
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

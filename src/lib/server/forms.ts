/**
 * The one way form actions read their body. A body that cannot be parsed (cut off, a wrong
 * boundary, more than BODY_SIZE_LIMIT) is the sender's problem: a 400 or 413 with a message, never
 * a 500. The parsed form is kept per request, so reading it twice costs nothing.
 */
import { error, type RequestEvent } from '@sveltejs/kit';
import { DomainError } from './errors';

export class FormBodyError extends DomainError {
	constructor(
		status: 400 | 413,
		message: string,
		/** The Content-Length the client declared, when it did. */
		readonly declaredBytes: number | null
	) {
		super(status, message, 'body');
		this.name = 'FormBodyError';
	}
}

const forms = new WeakMap<Request, Promise<FormData>>();

/** adapter-node's body limit errors the stream with a 413 (SvelteKitError) before we see any field. */
const statusOf = (e: unknown) => (e as { status?: unknown } | null)?.status;

async function parse(request: Request): Promise<FormData> {
	try {
		return await request.formData();
	} catch (e) {
		const declared = Number(request.headers.get('content-length'));
		const bytes = Number.isFinite(declared) && declared > 0 ? declared : null;
		if (statusOf(e) === 413) {
			throw new FormBodyError(413, 'The form is larger than this server accepts.', bytes);
		}
		throw new FormBodyError(400, 'The form could not be read; send it again.', bytes);
	}
}

/** @throws FormBodyError (400 or 413) when the body is not a readable form */
export function readFormData(request: Request): Promise<FormData> {
	let form = forms.get(request);
	if (!form) {
		form = parse(request);
		forms.set(request, form);
	}
	return form;
}

/** For actions: the form, or SvelteKit's error page with the 400/413 and its message. */
export async function readForm(event: Pick<RequestEvent, 'request'>): Promise<FormData> {
	try {
		return await readFormData(event.request);
	} catch (e) {
		if (e instanceof FormBodyError) error(e.status, e.message);
		throw e;
	}
}

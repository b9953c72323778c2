import { json } from '@sveltejs/kit';
import { DomainError } from './errors';

export function apiError(status: number, message: string, extra: Record<string, unknown> = {}) {
	return json({ error: { message, ...extra } }, { status });
}

/** A JSON response from text already serialized (SvelteKit's json() would encode it twice). */
export function jsonText(body: string, headers: Record<string, string> = {}): Response {
	return new Response(body, {
		headers: {
			'content-type': 'application/json',
			'content-length': String(Buffer.byteLength(body)),
			...headers
		}
	});
}

/** Reads a JSON body with a size cap; a bad body is a DomainError(400) naming "body". */
export async function readJson(request: Request, maxBytes = 256 * 1024): Promise<unknown> {
	const type = request.headers.get('content-type') ?? '';
	if (!type.includes('application/json')) {
		throw new DomainError(415, 'Send the body as JSON (Content-Type: application/json).', 'body');
	}
	const declared = Number(request.headers.get('content-length') ?? 0);
	if (declared > maxBytes)
		throw new DomainError(413, `The body is larger than ${maxBytes / 1024} kB.`, 'body');
	const text = await request.text();
	if (text.length > maxBytes)
		throw new DomainError(413, `The body is larger than ${maxBytes / 1024} kB.`, 'body');
	try {
		return JSON.parse(text);
	} catch {
		throw new DomainError(400, 'The body is not valid JSON.', 'body');
	}
}

/** Runs an API handler; expected failures become `{ error: { message, field } }` with their status. */
export async function handleApi(run: () => Promise<Response> | Response): Promise<Response> {
	try {
		return await run();
	} catch (e) {
		if (e instanceof DomainError)
			return apiError(e.status, e.message, e.field ? { field: e.field } : {});
		throw e;
	}
}

// The one shape of an upload action: guard, rate limit, read the multipart form, store, redirect.
import { fail, isHttpError, redirect, type RequestEvent } from '@sveltejs/kit';
import { uploadFormSchema, type UploadForm } from '$lib/schemas/measurement';
import { requireVerifiedMember } from '../http/guards';
import { isLimited } from '../http/rate-limit';
import { actionFailure, readForm } from '../http/actions';
import { retryBusy } from '../db/busy';
import { loadDesignRevision } from '../designs/revision-view';
import { tooLarge, UploadError } from './uploads';
import type { SessionUser } from '../accounts/auth';
import type { Revision } from '../db/schema';

const refused = (status: number, message: string) =>
	fail(status, { message, field: null, line: null, column: null, values: {} });

/** The text fields as sent (absent ones left out), to validate in the store and to refill the form. */
function textFields(data: UploadForm): Record<string, string> {
	const out: Record<string, string> = {};
	for (const [k, v] of Object.entries(data)) if (typeof v === 'string') out[k] = v;
	return out;
}

export async function uploadAction(
	event: RequestEvent<{ slug: string; n: string }>,
	opts: { max: number; what: string; anchor: string },
	store: (
		user: SessionUser,
		r: Revision,
		input: { fields: Record<string, string>; file: { bytes: Uint8Array; name: string } }
	) => Promise<{ id: string }>
) {
	const user = requireVerifiedMember();
	const { design, revision } = loadDesignRevision(
		event.params.slug,
		event.params.n,
		event.locals.user
	);
	if (await isLimited('upload', event)) {
		return refused(429, 'Too many uploads at once; wait a minute and try again.');
	}
	let form: Awaited<ReturnType<typeof readForm<typeof uploadFormSchema>>>;
	try {
		form = await readForm(event.request, uploadFormSchema, { files: true });
	} catch (e) {
		if (!isHttpError(e)) throw e;
		// Past the server's body limit the file is too large too: the same message as just over ours.
		if (e.status === 413) {
			const declared = Number(event.request.headers.get('content-length'));
			const size = Number.isFinite(declared) && declared > opts.max ? declared : opts.max + 1;
			return actionFailure(tooLarge(size, opts.max, opts.what), { values: {} });
		}
		return refused(400, 'The upload could not be read; send the form again.');
	}
	const values = textFields(form.data);
	let id: string;
	try {
		const file = form.data.file;
		if (!file || (file.size === 0 && file.name === '')) {
			throw new UploadError(400, `Choose a file to upload (${opts.what}).`, 'file');
		}
		if (file.size > opts.max) throw tooLarge(file.size, opts.max, opts.what);
		const bytes = new Uint8Array(await file.arrayBuffer());
		const input = { fields: values, file: { bytes, name: file.name } };
		id = (await retryBusy(() => store(user, revision!, input))).id;
	} catch (e) {
		return actionFailure(e, { values });
	}
	redirect(303, `/designs/${design.slug}/r/${revision!.number}?added=${id}#${opts.anchor}`);
}

// The one shape of an upload action: guard, rate limit, read the multipart form, store, redirect.
import { fail, redirect, type RequestEvent } from '@sveltejs/kit';
import { uploadFormSchema, type UploadForm } from '$lib/schemas/measurement';
import { requireVerifiedMember } from '../http/guards';
import { isLimited } from '../http/rate-limit';
import { actionFailure, readForm } from '../http/actions';
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
		form = await readForm(await event.request.formData(), uploadFormSchema, { files: true });
	} catch {
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
		id = (await store(user, revision!, { fields: values, file: { bytes, name: file.name } })).id;
	} catch (e) {
		return actionFailure(e, { values });
	}
	redirect(303, `/designs/${design.slug}/r/${revision!.number}?added=${id}#${opts.anchor}`);
}

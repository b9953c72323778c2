// The one shape of an upload action: guard, rate limit, read the multipart body, store, redirect.
import { fail, redirect, type RequestEvent } from '@sveltejs/kit';
import { requireVerifiedMember } from './guards';
import { isLimited } from './rate-limit';
import { loadDesignRevision } from './revision-view';
import { DomainError } from './errors';
import { retryBusy } from './db/busy';
import { FormBodyError, readFormData } from './forms';
import { formFields, formFile, tooLarge, UploadError } from './uploads';
import type { SessionUser } from './auth';
import type { Revision } from './db/schema';

/** Text fields a failed upload sends back to refill the form (never the file). */
const KEEP =
	/^(instrument|reference_plane|measured_on|notes|format|z0|column|quantity|freq_unit|parameter|target_frequency|deviations|materials|kind|caption)$/;

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
		return fail(429, {
			message: 'Too many uploads at once; wait a minute and try again.',
			field: null,
			line: null,
			column: null,
			values: {}
		});
	}
	let form: FormData;
	try {
		form = await readFormData(event.request);
	} catch (e) {
		if (!(e instanceof FormBodyError)) throw e;
		// Past the server's body limit the file is too large too: the same message as just over ours.
		const problem =
			e.status === 413
				? tooLarge(e.declaredBytes ?? opts.max + 1, opts.max, opts.what)
				: new UploadError(400, 'The upload could not be read; send the form again.');
		return fail(problem.status, {
			message: problem.message,
			field: problem.field ?? null,
			line: null,
			column: null,
			values: {}
		});
	}
	const fields = formFields(form);
	const values = Object.fromEntries(Object.entries(fields).filter(([k]) => KEEP.test(k)));
	let id: string;
	try {
		const file = await formFile(form, 'file', opts.max, opts.what);
		id = (await retryBusy(() => store(user, revision!, { fields, file }))).id;
	} catch (e) {
		if (e instanceof DomainError) {
			const where = e instanceof UploadError ? e : null;
			return fail(e.status, {
				message: e.message,
				field: e.field ?? null,
				line: where?.line ?? null,
				column: where?.column ?? null,
				values
			});
		}
		throw e;
	}
	redirect(303, `/designs/${design.slug}/r/${revision!.number}?added=${id}#${opts.anchor}`);
}

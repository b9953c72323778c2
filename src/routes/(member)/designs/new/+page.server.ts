import { fail, redirect } from '@sveltejs/kit';
import { superValidate, setError, message } from 'sveltekit-superforms';
import { actionFailure, firstProblem, formFailure, readForm } from '$lib/server/http/actions';
import { zod4 } from 'sveltekit-superforms/adapters';
import { importDesignSchema, newDesignSchema } from '$lib/schemas/new-design';
import { parseFrequency } from '$lib/rf/units/frequency';
import { MAX_DESIGN_FILE_BYTES } from '$lib/design-file';
import { requireVerifiedMember } from '$lib/server/http/guards';
import { createDesign, starterContent } from '$lib/server/designs/designs';
import { importDesignFile } from '$lib/server/designs/import';
import { isLimited } from '$lib/server/http/rate-limit';
import { retryBusy } from '$lib/server/db/busy';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	requireVerifiedMember();
	return { form: await superValidate(zod4(newDesignSchema)) };
};

export const actions: Actions = {
	create: async (event) => {
		const user = requireVerifiedMember();
		const form = await readForm(event.request, newDesignSchema);
		if (await isLimited('write', event))
			return message(form, 'Too many changes at once; wait a minute.', { status: 429 });
		if (!form.valid) return fail(400, { form });
		const f = parseFrequency(form.data.frequency);
		if (!f.ok) return setError(form, 'frequency', f.message);
		let slug: string;
		try {
			const { frequency: _f, slug: wanted, ...rest } = form.data;
			const meta = { ...rest, slug: wanted || undefined };
			slug = (await retryBusy(() => createDesign(user, meta, starterContent(f.hz)))).slug;
		} catch (e) {
			return formFailure(form, e);
		}
		redirect(303, `/designs/${slug}/r/1/edit`);
	},
	/** Starts a draft from a design file (.md with front matter), through the same parser as export. */
	import: async (event) => {
		const user = requireVerifiedMember();
		if (await isLimited('write', event))
			return fail(429, { importError: 'Too many changes at once; wait a minute.' });
		const form = await readForm(event.request, importDesignSchema, { files: true });
		if (!form.valid) return fail(400, { importError: firstProblem(form).message });
		const { file } = form.data;
		if (file.size > MAX_DESIGN_FILE_BYTES)
			return fail(413, { importError: 'The design file is larger than 512 kB.' });
		let created: string;
		try {
			created = (await importDesignFile(user, new Uint8Array(await file.arrayBuffer()))).slug;
		} catch (e) {
			const failure = actionFailure(e);
			return fail(failure.status, { importError: failure.data.message });
		}
		redirect(303, `/designs/${created}/r/1/edit`);
	}
};

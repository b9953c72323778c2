import { fail, redirect } from '@sveltejs/kit';
import { superValidate, setError, message } from 'sveltekit-superforms';
import { actionFailure, firstProblem, formFailure, readForm } from '$lib/server/http/actions';
import { zod4 } from 'sveltekit-superforms/adapters';
import { importDesignSchema, newDesignSchema } from '$lib/schemas/new-design';
import { parseFrequency } from '$lib/rf/units/frequency';
import { parseDesignFile, MAX_DESIGN_FILE_BYTES } from '$lib/design-file';
import { requireVerifiedMember } from '$lib/server/http/guards';
import { createDesign, starterContent } from '$lib/server/designs/designs';
import { isLimited } from '$lib/server/http/rate-limit';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	requireVerifiedMember();
	return { form: await superValidate(zod4(newDesignSchema)) };
};

export const actions: Actions = {
	create: async (event) => {
		const user = requireVerifiedMember();
		const form = await superValidate(event.request, zod4(newDesignSchema));
		if (await isLimited('write', event))
			return message(form, 'Too many changes at once; wait a minute.', { status: 429 });
		if (!form.valid) return fail(400, { form });
		const f = parseFrequency(form.data.frequency);
		if (!f.ok) return setError(form, 'frequency', f.message);
		let slug: string;
		try {
			const { frequency: _f, slug: wanted, ...meta } = form.data;
			slug = createDesign(user, { ...meta, slug: wanted || undefined }, starterContent(f.hz)).slug;
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
		const parsed = parseDesignFile(await file.text());
		if (!parsed.ok) return fail(422, { importError: parsed.error.message });
		const { title, slug, family, polarization, summary, ...content } = parsed.value;
		let created: string;
		try {
			created = createDesign(user, { title, slug, family, polarization, summary }, content).slug;
		} catch (e) {
			const failure = actionFailure(e);
			return fail(failure.status, { importError: failure.data.message });
		}
		redirect(303, `/designs/${created}/r/1/edit`);
	}
};

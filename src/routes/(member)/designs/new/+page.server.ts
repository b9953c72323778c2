import { fail, redirect } from '@sveltejs/kit';
import { superValidate, setError, message } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { newDesignSchema } from '$lib/schemas/new-design';
import { parseFrequency } from '$lib/rf/frequency-input';
import { parseDesignFile, MAX_DESIGN_FILE_BYTES } from '$lib/design-file';
import { requireVerifiedMember } from '$lib/server/guards';
import { createDesign, starterContent } from '$lib/server/designs';
import { assertFormulasCompile } from '$lib/server/dimensions';
import { decodeUtf8 } from '$lib/server/utf8';
import { DomainError } from '$lib/server/errors';
import { isLimited } from '$lib/server/rate-limit';
import { retryBusy } from '$lib/server/db/busy';
import { readForm } from '$lib/server/forms';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	requireVerifiedMember();
	return { form: await superValidate(zod4(newDesignSchema)) };
};

export const actions: Actions = {
	create: async (event) => {
		const user = requireVerifiedMember();
		const form = await superValidate(await readForm(event), zod4(newDesignSchema));
		if (await isLimited('write', event)) return message(form, 'Too many changes at once; wait a minute.', { status: 429 });
		if (!form.valid) return fail(400, { form });
		const f = parseFrequency(form.data.frequency);
		if (!f.ok) return setError(form, 'frequency', f.message);
		try {
			const { frequency: _f, slug: wanted, ...meta } = form.data;
			const { slug } = await retryBusy(() => createDesign(user, { ...meta, slug: wanted || undefined }, starterContent(f.hz)));
			redirect(303, `/designs/${slug}/r/1/edit`);
		} catch (e) {
			if (e instanceof DomainError && e.field === 'slug') return setError(form, 'slug', e.message);
			throw e;
		}
	},
	/** Starts a draft from a design file (.md with front matter), through the same parser as export. */
	import: async (event) => {
		const user = requireVerifiedMember();
		if (await isLimited('write', event)) return fail(429, { importError: 'Too many changes at once; wait a minute.' });
		const data = await readForm(event);
		const file = data.get('file');
		if (!(file instanceof File) || file.size === 0) return fail(400, { importError: 'Choose a design file (.md) to import.' });
		if (file.size > MAX_DESIGN_FILE_BYTES) return fail(413, { importError: 'The design file is larger than 512 kB.' });
		const text = decodeUtf8(new Uint8Array(await file.arrayBuffer()));
		if (!text.ok) {
			return fail(422, {
				importError: `The design file is not UTF-8 text: byte ${text.offset} (counted from 0) is not part of a valid character. Save the file as UTF-8 and import it again.`
			});
		}
		const parsed = parseDesignFile(text.text);
		if (!parsed.ok) return fail(422, { importError: parsed.error.message });
		const { title, slug, family, polarization, summary, ...content } = parsed.value;
		try {
			assertFormulasCompile(content);
			const created = await retryBusy(() => createDesign(user, { title, slug, family, polarization, summary }, content));
			redirect(303, `/designs/${created.slug}/r/1/edit`);
		} catch (e) {
			if (e instanceof DomainError) return fail(e.status, { importError: e.message });
			throw e;
		}
	}
};

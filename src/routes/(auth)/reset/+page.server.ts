import { fail, redirect } from '@sveltejs/kit';
import { superValidate, message } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { resetRequestSchema } from '$lib/schemas/auth';
import { requestPasswordReset } from '$lib/server/accounts/account-mail';
import { readForm } from '$lib/server/http/actions';
import { isLimited } from '$lib/server/http/rate-limit';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => ({
	form: await superValidate(zod4(resetRequestSchema))
});

export const actions: Actions = {
	default: async (event) => {
		const form = await readForm(event.request, resetRequestSchema);
		if (await isLimited('reset', event)) {
			return message(form, 'Too many reset requests. Wait a few minutes.', { status: 429 });
		}
		if (!form.valid) return fail(400, { form });
		// Same page, in the same time, either way: the answer never tells whether the address has an account.
		requestPasswordReset(form.data.email);
		redirect(303, '/reset?sent=1');
	}
};

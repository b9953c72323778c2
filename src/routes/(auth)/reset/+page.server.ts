import { fail, redirect } from '@sveltejs/kit';
import { superValidate, message } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { resetRequestSchema } from '$lib/schemas/auth';
import { findUserByEmail, issueEmailToken } from '$lib/server/accounts/accounts';
import { sendResetMail } from '$lib/server/accounts/account-mail';
import { isLimited } from '$lib/server/http/rate-limit';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => ({
	form: await superValidate(zod4(resetRequestSchema))
});

export const actions: Actions = {
	default: async (event) => {
		const form = await superValidate(event.request, zod4(resetRequestSchema));
		if (await isLimited('reset', event)) {
			return message(form, 'Too many reset requests. Wait a few minutes.', { status: 429 });
		}
		if (!form.valid) return fail(400, { form });
		const user = findUserByEmail(form.data.email);
		if (user && !user.disabledAt)
			await sendResetMail(user.email, issueEmailToken(user.id, 'reset_password'));
		// Same page either way: the answer never tells whether the address has an account.
		redirect(303, '/reset?sent=1');
	}
};

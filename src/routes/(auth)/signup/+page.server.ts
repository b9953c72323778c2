import { fail, redirect } from '@sveltejs/kit';
import { superValidate, setError, message } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { signUpSchema } from '$lib/schemas/auth';
import { createAccount, issueEmailToken } from '$lib/server/accounts/accounts';
import { sendAlreadyRegisteredMail, sendVerificationMail } from '$lib/server/accounts/account-mail';
import { passwordProblem } from '$lib/server/accounts/password';
import { retryBusy } from '$lib/server/db/busy';
import { readForm } from '$lib/server/http/actions';
import { isLimited } from '$lib/server/http/rate-limit';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => {
	if (locals.user) redirect(303, '/account');
	return { form: await superValidate(zod4(signUpSchema)) };
};

export const actions: Actions = {
	default: async (event) => {
		const form = await readForm(event.request, signUpSchema);
		const { password } = form.data;
		form.data.password = '';
		if (await isLimited('signUp', event)) {
			return message(form, 'Too many sign-ups from here. Wait a few minutes and try again.', {
				status: 429
			});
		}
		if (!form.valid) return fail(400, { form });
		const problem = passwordProblem(password, form.data.email);
		if (problem) return setError(form, 'password', problem);

		const created = await retryBusy(() => createAccount({ ...form.data, password }));
		// The same answer whether or not the address already had an account (ASVS 6.3.8).
		if (created) {
			await retryBusy(() =>
				sendVerificationMail(
					created.email,
					form.data.displayName,
					issueEmailToken(created.id, 'verify_email')
				)
			);
		} else {
			await retryBusy(() => sendAlreadyRegisteredMail(form.data.email.toLowerCase()));
		}
		redirect(303, '/signup/sent');
	}
};

import { error, fail, redirect } from '@sveltejs/kit';
import { superValidate, setError, message } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { resetConfirmSchema } from '$lib/schemas/auth';
import { peekEmailToken, resetPassword, TOKEN_MESSAGES } from '$lib/server/accounts/accounts';
import { clearSessionCookie } from '$lib/server/accounts/auth';
import { passwordProblem } from '$lib/server/accounts/password';
import { readForm } from '$lib/server/http/actions';
import { isLimited } from '$lib/server/http/rate-limit';
import { retryBusy } from '$lib/server/db/busy';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url }) => {
	const token = url.searchParams.get('token') ?? '';
	if (!token) error(400, TOKEN_MESSAGES.invalid);
	const check = peekEmailToken(token, 'reset_password');
	const form = await superValidate({ token, password: '' }, zod4(resetConfirmSchema), {
		errors: false
	});
	return { form, problem: check.ok ? null : TOKEN_MESSAGES[check.reason] };
};

export const actions: Actions = {
	default: async (event) => {
		const form = await readForm(event.request, resetConfirmSchema);
		const { password } = form.data;
		form.data.password = '';
		if (await isLimited('reset', event)) {
			return message(form, 'Too many attempts. Wait a few minutes.', { status: 429 });
		}
		if (!form.valid) return fail(400, { form });
		const problem = passwordProblem(password);
		if (problem) return setError(form, 'password', problem);
		const result = await retryBusy(() => resetPassword(form.data.token, password));
		if (!result.ok) return message(form, TOKEN_MESSAGES[result.reason], { status: 400 });
		clearSessionCookie(event.cookies);
		redirect(303, '/signin?reset=1');
	}
};

import { fail, redirect } from '@sveltejs/kit';
import { superValidate, message } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { dev } from '$app/environment';
import { signInSchema } from '$lib/schemas/auth';
import { checkCredentials } from '$lib/server/accounts/accounts';
import { createSession, invalidateSession, setSessionCookie } from '$lib/server/accounts/auth';
import { signInThrottle } from '$lib/server/accounts/sign-in-throttle';
import { retryBusy } from '$lib/server/db/busy';
import { readForm } from '$lib/server/http/actions';
import { isLimited } from '$lib/server/http/rate-limit';
import { safeNext } from '$lib/server/http/safe-next';
import type { Actions, PageServerLoad } from './$types';

const GENERIC_SIGNIN_ERROR = 'That e-mail and password do not match an account.';

export const load: PageServerLoad = async ({ locals, url }) => {
	if (locals.user) redirect(303, safeNext(url.searchParams.get('next')));
	const form = await superValidate(zod4(signInSchema));
	form.data.next = safeNext(url.searchParams.get('next'), '');
	return { form };
};

export const actions: Actions = {
	default: async (event) => {
		const form = await readForm(event.request, signInSchema);
		const { password } = form.data;
		form.data.password = '';
		if (await isLimited('signIn', event)) {
			return message(form, 'Too many sign-in attempts. Wait a minute and try again.', {
				status: 429
			});
		}
		if (!form.valid) return fail(400, { form });
		// Guessing one account from many addresses: its attempts take turns, further apart each time.
		const turn = await signInThrottle.turn(form.data.email);
		if (!turn.ok) {
			return message(
				form,
				`Many sign-in attempts for this account right now. Wait ${turn.retryAfterSeconds} seconds and try again.`,
				{ status: 429 }
			);
		}
		const user = await checkCredentials(form.data.email, password);
		if (!user) {
			signInThrottle.failed(form.data.email);
			return message(form, GENERIC_SIGNIN_ERROR, { status: 400 });
		}
		signInThrottle.succeeded(form.data.email);

		// A fresh session at every sign-in; the one this browser had before ends.
		const previous = event.locals.session?.id;
		const { token, session } = await retryBusy(() => {
			if (previous) invalidateSession(previous);
			return createSession(user.id);
		});
		setSessionCookie(event.cookies, token, session, !dev);
		redirect(303, safeNext(form.data.next, user.emailVerifiedAt ? '/designs' : '/account'));
	}
};

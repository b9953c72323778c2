import { error, fail, redirect } from '@sveltejs/kit';
import { peekEmailToken, verifyEmail, TOKEN_MESSAGES } from '$lib/server/accounts/accounts';
import { verifySchema } from '$lib/schemas/auth';
import { readForm } from '$lib/server/http/actions';
import type { Actions, PageServerLoad } from './$types';

// The link only shows a button: GET never changes state, and mail scanners that prefetch links
// cannot use up the token.
export const load: PageServerLoad = ({ url }) => {
	const token = url.searchParams.get('token') ?? '';
	if (!token) error(400, TOKEN_MESSAGES.invalid);
	const check = peekEmailToken(token, 'verify_email');
	return { token, problem: check.ok ? null : TOKEN_MESSAGES[check.reason] };
};

export const actions: Actions = {
	default: async ({ request }) => {
		const form = await readForm(request, verifySchema);
		if (!form.valid) return fail(400, { problem: TOKEN_MESSAGES.invalid });
		const result = verifyEmail(form.data.token);
		if (!result.ok) return fail(400, { problem: TOKEN_MESSAGES[result.reason] });
		redirect(303, '/signin?verified=1');
	}
};

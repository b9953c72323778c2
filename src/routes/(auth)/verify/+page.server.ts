import { error, fail, redirect } from '@sveltejs/kit';
import { peekEmailToken, verifyEmail, TOKEN_MESSAGES } from '$lib/server/accounts/accounts';
import { verifySchema } from '$lib/schemas/auth';
import { retryBusy } from '$lib/server/db/busy';
import { readForm } from '$lib/server/http/actions';
import { isLimited } from '$lib/server/http/rate-limit';
import type { Actions, PageServerLoad } from './$types';

const TOO_MANY = 'Too many confirmation attempts from here. Wait a minute and try again.';

// The link only shows a button: GET never changes state, and mail scanners that prefetch links
// cannot use up the token.
export const load: PageServerLoad = async (event) => {
	const token = event.url.searchParams.get('token') ?? '';
	if (!token) error(400, TOKEN_MESSAGES.invalid);
	// A POST was counted by the action already.
	if (event.request.method === 'GET' && (await isLimited('verify', event))) error(429, TOO_MANY);
	const check = peekEmailToken(token, 'verify_email');
	return { token, problem: check.ok ? null : TOKEN_MESSAGES[check.reason] };
};

export const actions: Actions = {
	default: async (event) => {
		if (await isLimited('verify', event)) return fail(429, { problem: TOO_MANY });
		const form = await readForm(event.request, verifySchema);
		if (!form.valid) return fail(400, { problem: TOKEN_MESSAGES.invalid });
		const result = await retryBusy(() => verifyEmail(form.data.token));
		if (!result.ok) return fail(400, { problem: TOKEN_MESSAGES[result.reason] });
		redirect(303, '/signin?verified=1');
	}
};

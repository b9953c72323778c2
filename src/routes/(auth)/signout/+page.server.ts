import { redirect } from '@sveltejs/kit';
import { clearSessionCookie, invalidateSession } from '$lib/server/accounts/auth';
import { retryBusy } from '$lib/server/db/busy';
import type { Actions, PageServerLoad } from './$types';

// Signing out changes state, so it is a POST; a GET only lands back on the home page.
export const load: PageServerLoad = () => redirect(303, '/');

export const actions: Actions = {
	default: async ({ locals, cookies }) => {
		const id = locals.session?.id;
		if (id) await retryBusy(() => invalidateSession(id));
		clearSessionCookie(cookies);
		redirect(303, '/');
	}
};

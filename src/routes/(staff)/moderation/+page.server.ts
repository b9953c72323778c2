import { fail } from '@sveltejs/kit';
import { roleChangeSchema } from '$lib/schemas/auth';
import { requireRole } from '$lib/server/http/guards';
import { listUsers, setRole } from '$lib/server/accounts/users';
import { retryBusy } from '$lib/server/db/busy';
import { readForm } from '$lib/server/http/actions';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ url }) => {
	requireRole('moderator');
	const q = url.searchParams.get('q') ?? '';
	return {
		q,
		users: listUsers(q).map((u) => ({
			id: u.id,
			email: u.email,
			displayName: u.displayName,
			role: u.role,
			verified: u.emailVerifiedAt !== null,
			createdAt: u.createdAt.toISOString().slice(0, 10)
		}))
	};
};

export const actions: Actions = {
	setRole: async (event) => {
		const actor = requireRole('moderator');
		const form = await readForm(event.request, roleChangeSchema);
		if (!form.valid)
			return fail(400, { message: 'Choose a user and one of member, reviewer, moderator.' });
		const result = await retryBusy(() => setRole(actor.id, form.data.userId, form.data.role));
		if (!result.ok) return fail(400, { message: result.message });
		return { message: `Role changed from ${result.from} to ${result.to}.` };
	}
};

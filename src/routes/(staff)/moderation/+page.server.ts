import { fail } from '@sveltejs/kit';
import { superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { roleChangeSchema } from '$lib/schemas/auth';
import { requireRole } from '$lib/server/guards';
import { listUsers, setRole } from '$lib/server/users';
import { retryBusy } from '$lib/server/db/busy';
import { readForm } from '$lib/server/forms';
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
		const form = await superValidate(await readForm(event), zod4(roleChangeSchema));
		if (!form.valid) return fail(400, { message: 'Choose a user and one of member, reviewer, moderator.' });
		const result = await retryBusy(() => setRole(actor.id, form.data.userId, form.data.role));
		if (!result.ok) return fail(400, { message: result.message });
		return { message: `Role changed from ${result.from} to ${result.to}.` };
	}
};

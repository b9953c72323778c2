import { fail } from '@sveltejs/kit';
import { eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { users } from '$lib/server/db/schema';
import { issueEmailToken } from '$lib/server/accounts';
import { sendVerificationMail } from '$lib/server/account-mail';
import { requireUser } from '$lib/server/guards';
import { isLimited } from '$lib/server/rate-limit';
import { retryBusy } from '$lib/server/db/busy';
import { readForm } from '$lib/server/forms';
import { FAMILY_VALUES, type Family } from '$lib/schemas/design';
import { notificationSettings, setNotificationSettings } from '$lib/server/notify';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = () => {
	const user = requireUser();
	const row = db.select().from(users).where(eq(users.id, user.id)).get()!;
	return {
		account: {
			email: row.email,
			displayName: row.displayName,
			role: row.role,
			emailVerified: row.emailVerifiedAt !== null,
			createdAt: row.createdAt.toISOString()
		},
		notifications: notificationSettings(user.id)
	};
};

export const actions: Actions = {
	resend: async (event) => {
		const user = requireUser();
		if (user.emailVerified) return { resent: false, message: 'Your address is already confirmed.' };
		if (await isLimited('reset', event)) return fail(429, { message: 'Too many requests; wait a few minutes.' });
		await retryBusy(() => sendVerificationMail(user.email, user.displayName, issueEmailToken(user.id, 'verify_email')));
		return { resent: true, message: 'A new confirmation link is on its way.' };
	},
	notifications: async (event) => {
		const user = requireUser();
		const data = await readForm(event);
		const families = data.getAll('family').map(String);
		const unknown = families.filter((f) => !(FAMILY_VALUES as readonly string[]).includes(f));
		if (unknown.length) return fail(400, { notifyMessage: `Unknown family "${unknown[0].slice(0, 40)}".` });
		await retryBusy(() =>
			setNotificationSettings(user.id, {
				notifyOnSubmit: data.get('notify_on_submit') === 'on',
				notifyOnFeedback: data.get('notify_on_feedback') === 'on',
				followedFamilies: families as Family[]
			})
		);
		return { notifySaved: true, notifyMessage: 'Notification settings saved.' };
	}
};

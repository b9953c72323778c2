import { fail } from '@sveltejs/kit';
import { accountOf } from '$lib/server/accounts/users';
import { issueEmailToken } from '$lib/server/accounts/accounts';
import { sendVerificationMail } from '$lib/server/accounts/account-mail';
import { retryBusy } from '$lib/server/db/busy';
import { requireUser } from '$lib/server/http/guards';
import { isLimited } from '$lib/server/http/rate-limit';
import { notificationsFormSchema } from '$lib/schemas/account';
import { firstProblem, readForm } from '$lib/server/http/actions';
import { notificationSettings, setNotificationSettings } from '$lib/server/mail/notify';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = () => {
	const user = requireUser();
	return {
		account: accountOf(user.id),
		notifications: notificationSettings(user.id)
	};
};

export const actions: Actions = {
	resend: async (event) => {
		const user = requireUser();
		if (user.emailVerified) return { resent: false, message: 'Your address is already confirmed.' };
		if (await isLimited('reset', event))
			return fail(429, { message: 'Too many requests; wait a few minutes.' });
		await retryBusy(() =>
			sendVerificationMail(user.email, user.displayName, issueEmailToken(user.id, 'verify_email'))
		);
		return { resent: true, message: 'A new confirmation link is on its way.' };
	},
	notifications: async (event) => {
		const user = requireUser();
		const form = await readForm(event.request, notificationsFormSchema);
		if (!form.valid) return fail(400, { notifyMessage: firstProblem(form).message });
		await retryBusy(() =>
			setNotificationSettings(user.id, {
				notifyOnSubmit: form.data.notify_on_submit,
				notifyOnFeedback: form.data.notify_on_feedback,
				followedFamilies: form.data.family
			})
		);
		return { notifySaved: true, notifyMessage: 'Notification settings saved.' };
	}
};

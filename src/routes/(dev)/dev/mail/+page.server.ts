import { error } from '@sveltejs/kit';
import { env } from '$env/dynamic/private';
import { listOutbox } from '$lib/server/mail/outbox';
import { outboxDir, usesOutbox } from '$lib/server/mail/send';
import type { PageServerLoad } from './$types';

/** Local mail viewer: only without SMTP and outside production (NODE_ENV=production hides it). */
export const load: PageServerLoad = async () => {
	if (!usesOutbox() || env.NODE_ENV === 'production') error(404, 'Not found');
	const messages = await listOutbox(outboxDir(), { limit: 50 });
	return {
		messages: messages.map((m) => ({
			id: m.id,
			to: m.to,
			subject: m.subject,
			date: m.date,
			text: m.text,
			links: m.links
		}))
	};
};

import { error } from '@sveltejs/kit';
import { listOutbox } from '$lib/server/mail/outbox';
import { outboxDir, usesOutbox } from '$lib/server/mail/send';
import { isOperator } from '$lib/server/http/operator';
import type { PageServerLoad } from './$types';

/**
 * Local mail viewer: only without SMTP, outside production, and only for the operator (this machine
 * or a signed-in moderator). Everyone else gets the same 404 as if the page did not exist: the
 * outbox holds password-reset links.
 */
export const load: PageServerLoad = async (event) => {
	if (!usesOutbox() || !isOperator(event)) error(404, 'Not found');
	event.setHeaders({ 'cache-control': 'private, no-store' });
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

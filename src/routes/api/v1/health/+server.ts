import { json } from '@sveltejs/kit';
import { mailWarnings, usesOutbox } from '$lib/server/mail/send';
import type { RequestHandler } from './$types';

/**
 * Liveness probe; also the benchmark's baseline for a trivial SvelteKit JSON route. It says how mail
 * leaves the server, and warns when a production server delivers none.
 */
export const GET: RequestHandler = () =>
	json({
		ok: true,
		service: 'bandwright',
		mail: usesOutbox() ? 'outbox' : 'smtp',
		warnings: mailWarnings()
	});

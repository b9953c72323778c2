import { error, json } from '@sveltejs/kit';
import { env } from '$env/dynamic/private';
import { apiError, handleApi, readJson } from '$lib/server/http/api';
import { isLimited } from '$lib/server/http/rate-limit';
import type { RequestHandler } from './$types';

/**
 * The benchmark's floor for POST /api/v1/evaluate: the same rate limit and body reading, and no
 * evaluation. Exists only when the bench starts the server with BENCH_ROUTES=1.
 */
export const POST: RequestHandler = (event) => {
	if (env.BENCH_ROUTES !== '1') error(404, 'Not found');
	return handleApi(async () => {
		if (await isLimited('compute', event))
			return apiError(429, 'Too many requests.', { field: 'body' });
		const body = await readJson(event.request);
		return json({ ok: typeof body === 'object' });
	});
};

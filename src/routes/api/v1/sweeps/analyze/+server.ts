import { json } from '@sveltejs/kit';
import { parseAnalyzeQuery } from '$lib/rf/sweeps/sweep';
import { apiError } from '$lib/server/http/api';
import { analyzeBytes, MAX_SWEEP_BYTES } from '$lib/server/measurements/measurements';
import { isLimited } from '$lib/server/http/rate-limit';
import { readBodyLimited, UploadError } from '$lib/server/measurements/uploads';
import type { RequestHandler } from './$types';

/**
 * The sweep file as the raw body (≤ 10 MB) → metrics, claim check and display series. Stores
 * nothing, so no sign-in; uploads share the 'upload' rate limit, the parse is the 'compute' one.
 */
export const POST: RequestHandler = async (event) => {
	if ((await isLimited('upload', event)) || (await isLimited('compute', event))) {
		return apiError(429, 'Too many requests. Wait a minute and try again.');
	}
	const query = parseAnalyzeQuery(event.url.searchParams);
	if (!query.ok) return apiError(400, query.error.message, { field: query.error.field });
	try {
		const body = await readBodyLimited(event.request, MAX_SWEEP_BYTES, 'a sweep');
		return json(analyzeBytes(body, query.value), { headers: { 'cache-control': 'no-store' } });
	} catch (e) {
		if (e instanceof UploadError) return json({ error: e.toJSON() }, { status: e.status });
		throw e;
	}
};

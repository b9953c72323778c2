import { apiError, handleApi, jsonText, readJson } from '$lib/server/http/api';
import { evaluateBody } from '$lib/server/designs/evaluate';
import { isLimited } from '$lib/server/http/rate-limit';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = (event) =>
	handleApi(async () => {
		if (await isLimited('compute', event))
			return apiError(429, 'Too many requests. Wait a minute.', { field: 'body' });
		return jsonText(JSON.stringify(evaluateBody(await readJson(event.request))));
	});

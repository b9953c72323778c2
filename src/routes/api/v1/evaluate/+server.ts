import { json } from '@sveltejs/kit';
import { computeTable, TableInputError } from '$lib/rf/table';
import { parseEvaluateRequest, toTableInput } from '$lib/rf/evaluate-request';
import { apiError, handleApi, readJson } from '$lib/server/api';
import { isLimited } from '$lib/server/rate-limit';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = (event) =>
	handleApi(async () => {
		if (await isLimited('compute', event)) return apiError(429, 'Too many requests. Wait a minute.', { field: 'body' });
		const parsed = parseEvaluateRequest(await readJson(event.request));
		if (!parsed.ok) return apiError(400, parsed.error.message, { field: parsed.error.field });
		const { definition, options } = toTableInput(parsed.value);
		try {
			return json(computeTable(definition, options));
		} catch (e) {
			if (e instanceof TableInputError) return apiError(400, e.message, { field: e.field });
			throw e;
		}
	});

import { json } from '@sveltejs/kit';
import { apiError } from '$lib/server/http/api';
import { parseDesignQuery } from '$lib/server/designs/design-query';
import { isLimited } from '$lib/server/http/rate-limit';
import { searchDesigns } from '$lib/server/designs/search';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async (event) => {
	if (await isLimited('compute', event)) return apiError(429, 'Too many requests. Wait a minute.');
	const { query, problems } = parseDesignQuery(event.url.searchParams);
	if (problems.length) return apiError(400, problems.join(' '));
	return json(searchDesigns(query));
};

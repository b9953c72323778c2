import { parseDesignQuery } from '$lib/server/design-query';
import { searchDesigns } from '$lib/server/search';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = ({ url }) => {
	const { query, problems } = parseDesignQuery(url.searchParams);
	return { results: searchDesigns(query), problems, filters: Object.fromEntries(url.searchParams) };
};

import { parseDesignQuery } from '$lib/server/designs/design-query';
import { searchDesigns } from '$lib/server/designs/search';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = ({ url }) => {
	const { query, problems } = parseDesignQuery(url.searchParams);
	return { results: searchDesigns(query), problems, filters: Object.fromEntries(url.searchParams) };
};

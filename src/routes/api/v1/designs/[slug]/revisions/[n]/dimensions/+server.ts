import { parseViewState } from '$lib/rf/units/view-state';
import { apiError, jsonText } from '$lib/server/http/api';
import { tableForViewJson } from '$lib/server/designs/dimensions';
import { canRead, getRevisionHead } from '$lib/server/designs/lookups';
import { isLimited } from '$lib/server/http/rate-limit';
import type { RequestHandler } from './$types';

/** The dimension table of one revision at ?f= (Hz, or text such as "5.8 GHz"), in ?units=. */
export const GET: RequestHandler = async (event) => {
	const { params, url, locals } = event;
	if (await isLimited('compute', event)) return apiError(429, 'Too many requests. Wait a minute.');
	const r = getRevisionHead(params.slug, Number(params.n));
	if (!r || !canRead(locals.user, r)) return apiError(404, 'No such design revision.');
	const { view, problems } = parseViewState(url.searchParams, r);
	if (problems.length) return apiError(400, problems[0].message, { field: problems[0].field });
	return jsonText(tableForViewJson(r, view), {
		'cache-control': r.state === 'draft' ? 'private, no-store' : 'public, max-age=300'
	});
};

import { json } from '@sveltejs/kit';
import { apiError, handleApi } from '$lib/server/http/api';
import { getDesignBySlug } from '$lib/server/designs/lookups';
import { compareRevisions, resolveCompare } from '$lib/server/reviews/compare';
import { isLimited } from '$lib/server/http/rate-limit';
import type { RequestHandler } from './$types';

/** Diff of two revisions of one design: ?from=&to= (revision numbers), ?f= (values at, default: to's design frequency). */
export const GET: RequestHandler = async (event) => {
	const { params, url, locals } = event;
	if (await isLimited('compute', event)) return apiError(429, 'Too many requests. Wait a minute.');
	return handleApi(() => {
		const design = getDesignBySlug(params.slug);
		if (!design) return apiError(404, 'No design has this address.');
		const q = url.searchParams;
		const { from, to, hz } = resolveCompare(
			design,
			{ from: q.get('from'), to: q.get('to'), f: q.get('f') },
			locals.user
		);
		const diff = compareRevisions(from, to, hz);
		const hasDraft = from.state === 'draft' || to.state === 'draft';
		return json(
			{ design: design.slug, ...diff },
			{
				headers: {
					'cache-control': hasDraft || locals.user ? 'private, no-store' : 'public, max-age=60'
				}
			}
		);
	});
};

import { json } from '@sveltejs/kit';
import { apiError } from '$lib/server/http/api';
import { ownerName } from '$lib/server/accounts/users';
import { getMeasurement, measurementSeries } from '$lib/server/measurements/measurements';
import { canRead, getRevisionById } from '$lib/server/designs/lookups';
import { isLimited } from '$lib/server/http/rate-limit';
import type { RequestHandler } from './$types';

/** One sweep's chart data: metrics, claim check and the display series (≤ 2000 points). */
export const GET: RequestHandler = async (event) => {
	if (await isLimited('compute', event)) return apiError(429, 'Too many requests. Wait a minute.');
	const m = getMeasurement(event.params.id);
	const r = m ? getRevisionById(m.revisionId) : null;
	if (!m || !r || !canRead(event.locals.user, r)) return apiError(404, 'No such measurement.');
	return json(measurementSeries(m, ownerName(m.uploaderId)), {
		headers: { 'cache-control': r.state === 'draft' ? 'private, no-store' : 'public, max-age=300' }
	});
};

import { parseFrequency } from '$lib/rf/units/frequency';
import { apiError, jsonText } from '$lib/server/http/api';
import { revisionTableJson } from '$lib/server/designs/dimensions';
import { canRead, getRevisionHead } from '$lib/server/designs/lookups';
import { isLimited } from '$lib/server/http/rate-limit';
import { bandFor, parseUnits } from '$lib/server/designs/revision-view';
import type { RequestHandler } from './$types';

/** The dimension table of one revision at ?f= (Hz, or text such as "5.8 GHz"), in ?units=. */
export const GET: RequestHandler = async (event) => {
	const { params, url, locals } = event;
	if (await isLimited('compute', event)) return apiError(429, 'Too many requests. Wait a minute.');
	const r = getRevisionHead(params.slug, Number(params.n));
	if (!r || !canRead(locals.user, r)) return apiError(404, 'No such design revision.');
	const fText = url.searchParams.get('f');
	let hz = r.designHz;
	if (fText !== null) {
		const parsed = parseFrequency(fText);
		if (!parsed.ok) return apiError(400, parsed.message, { field: 'f' });
		hz = parsed.hz;
	}
	const units = url.searchParams.get('units');
	if (units !== null && parseUnits(units) !== units) {
		return apiError(400, 'units must be mm, in or in_frac.', { field: 'units' });
	}
	const { band, unknown } = bandFor(r, hz, url.searchParams.get('band'));
	if (unknown) return apiError(400, 'Unknown band preset.', { field: 'band' });
	const body = revisionTableJson(r, { frequencyHz: hz, units: parseUnits(units), bandHz: band });
	return jsonText(body, { 'cache-control': r.state === 'draft' ? 'private, no-store' : 'public, max-age=300' });
};

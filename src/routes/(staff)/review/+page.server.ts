import { FAMILY_VALUES } from '$lib/schemas/design';
import { BANDS, bandById } from '$lib/rf/units/bands';
import { requireRole } from '$lib/server/http/guards';
import { listQueue } from '$lib/server/reviews/reviews';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = ({ url }) => {
	const user = requireRole('reviewer');
	const familyParam = url.searchParams.get('family') ?? '';
	const bandParam = url.searchParams.get('band') ?? '';
	const family = (FAMILY_VALUES as readonly string[]).includes(familyParam) ? familyParam : '';
	const band = bandById(bandParam) ? bandParam : '';
	const mine = url.searchParams.get('mine') === '1';
	const now = Date.now();
	return {
		filters: { family, band, mine },
		ignored:
			(familyParam && !family) || (bandParam && !band)
				? 'An unknown family or band in the address was ignored.'
				: null,
		bands: BANDS.map((b) => ({ id: b.id, name: b.name })),
		queue: listQueue(user, { family, band, mine }).map((q) => ({
			...q,
			ageDays: q.submittedAt
				? Math.max(0, Math.floor((now - Date.parse(q.submittedAt)) / 86_400_000))
				: null
		}))
	};
};

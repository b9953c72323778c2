import { parseFrequency } from '$lib/rf/units/frequency';
import { bandById } from '$lib/rf/units/bands';
import { FAMILY_VALUES, POLARIZATION_VALUES } from '$lib/schemas/design';
import type { DesignQuery } from './search';

/** Reads listing filters from a query string; unknown values are dropped with a note, never a 500. */
export function parseDesignQuery(params: URLSearchParams): {
	query: DesignQuery;
	problems: string[];
} {
	const problems: string[] = [];
	const query: DesignQuery = {};
	const q = params.get('q')?.trim();
	if (q) query.q = q.slice(0, 200);
	const family = params.get('family');
	if (family) {
		if ((FAMILY_VALUES as readonly string[]).includes(family)) query.family = family;
		else problems.push(`Unknown family "${family.slice(0, 40)}" ignored.`);
	}
	const pol = params.get('polarization');
	if (pol) {
		if ((POLARIZATION_VALUES as readonly string[]).includes(pol)) query.polarization = pol;
		else problems.push('Unknown polarization ignored.');
	}
	const band = params.get('band');
	if (band) {
		const b = bandById(band);
		if (b) query.band = [b.lo_hz, b.hi_hz];
		else problems.push('Unknown band preset ignored.');
	}
	const contains = params.get('contains_hz') ?? params.get('contains');
	if (contains) {
		const parsed = parseFrequency(contains);
		if (parsed.ok) query.containsHz = parsed.hz;
		else problems.push(`Frequency filter ignored: ${parsed.message}`);
	}
	const status = params.get('status');
	if (status === 'retired' || status === 'all' || status === 'active') query.status = status;
	const sort = params.get('sort');
	if (sort === 'newest' || sort === 'reports' || sort === 'relevance') query.sort = sort;
	const page = Number(params.get('page') ?? 1);
	query.page = Number.isInteger(page) && page >= 1 && page <= 1000 ? page : 1;
	return { query, problems };
}

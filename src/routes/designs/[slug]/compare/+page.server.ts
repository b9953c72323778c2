import { error } from '@sveltejs/kit';
import { getDesignBySlug } from '$lib/server/designs/lookups';
import { compareRevisions, resolveCompare } from '$lib/server/reviews/compare';
import { DomainError } from '$lib/server/http/errors';
import { formatFrequency } from '$lib/rf/units/frequency';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = ({ params, url, locals }) => {
	const design = getDesignBySlug(params.slug);
	if (!design) error(404, 'No design has this address.');
	const q = url.searchParams;
	try {
		const { from, to, hz, frequencyMessage, revisions } = resolveCompare(
			design,
			{ from: q.get('from'), to: q.get('to'), f: q.get('f') },
			locals.user,
			false
		);
		return {
			design: { slug: design.slug, title: design.title },
			revisions,
			frequencyText: q.get('f')?.trim() || formatFrequency(hz),
			frequencyMessage,
			diff: compareRevisions(from, to, hz)
		};
	} catch (e) {
		if (e instanceof DomainError) error(e.status, e.message);
		throw e;
	}
};

import { error, redirect } from '@sveltejs/kit';
import { defaultRevision } from '$lib/server/designs/lookups';
import { loadDesignRevision, revisionPageData } from '$lib/server/designs/revision-view';
import { listRevisions } from '$lib/server/designs/lookups';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = ({ params, url, locals }) => {
	const { design } = loadDesignRevision(params.slug, undefined, locals.user);
	const shown = defaultRevision(design);
	if (!shown) {
		// Nothing published yet: the author goes to their draft, everyone else gets a 404.
		const draft = listRevisions(design.id).find((r) => r.authorId === locals.user?.id);
		if (draft) redirect(303, `/designs/${design.slug}/r/${draft.number}`);
		error(404, 'This design has no published revision yet.');
	}
	return revisionPageData(design, shown, url, locals.user);
};

import { error, redirect } from '@sveltejs/kit';
import { defaultRevision, listRevisions } from '$lib/server/designs/lookups';
import { loadDesignRevision, revisionPageData } from '$lib/server/designs/revision-view';
import { startRevision } from '$lib/server/designs/revisions';
import { requireVerifiedMember } from '$lib/server/http/guards';
import { actionFailure } from '$lib/server/http/actions';
import { retryBusy } from '$lib/server/db/busy';
import type { Actions, PageServerLoad } from './$types';

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

/** What the design's owner does to the design as a whole. */
export const actions: Actions = {
	newRevision: async ({ params, locals }) => {
		const user = requireVerifiedMember();
		const { design } = loadDesignRevision(params.slug, undefined, locals.user);
		let number: number;
		try {
			number = (await retryBusy(() => startRevision(user, design))).number;
		} catch (e) {
			return actionFailure(e);
		}
		redirect(303, `/designs/${design.slug}/r/${number}/edit`);
	}
};

import { redirect } from '@sveltejs/kit';
import { loadDesignRevision, revisionPageData } from '$lib/server/designs/revision-view';
import { requireVerifiedMember } from '$lib/server/http/guards';
import { actionFailure } from '$lib/server/http/actions';
import { retryBusy } from '$lib/server/db/busy';
import { submitRevision, withdrawRevision } from '$lib/server/designs/revisions';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ params, url, locals }) => {
	const { design, revision } = loadDesignRevision(params.slug, params.n, locals.user);
	return revisionPageData(design, revision!, url, locals.user);
};

/** What a revision's author does to that revision; design-level actions live on the design's route. */
export const actions: Actions = {
	submit: async ({ params, locals }) => {
		const user = requireVerifiedMember();
		const { design, revision } = loadDesignRevision(params.slug, params.n, locals.user);
		try {
			await retryBusy(() => submitRevision(user, revision!.id));
		} catch (e) {
			return actionFailure(e);
		}
		redirect(303, `/designs/${design.slug}/r/${revision!.number}?submitted=1`);
	},
	withdraw: async ({ params, locals }) => {
		const user = requireVerifiedMember();
		const { design, revision } = loadDesignRevision(params.slug, params.n, locals.user);
		try {
			await retryBusy(() => withdrawRevision(user, revision!.id));
		} catch (e) {
			return actionFailure(e);
		}
		redirect(303, `/designs/${design.slug}/r/${revision!.number}`);
	}
};

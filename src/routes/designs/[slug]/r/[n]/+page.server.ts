import { fail, redirect } from '@sveltejs/kit';
import { loadDesignRevision, revisionPageData } from '$lib/server/revision-view';
import { requireVerifiedMember } from '$lib/server/guards';
import { startRevision, submitRevision, withdrawRevision } from '$lib/server/revisions';
import { DomainError } from '$lib/server/errors';
import { retryBusy } from '$lib/server/db/busy';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ params, url, locals }) => {
	const { design, revision } = loadDesignRevision(params.slug, params.n, locals.user);
	return revisionPageData(design, revision!, url, locals.user);
};

async function run<T>(fn: () => T) {
	try {
		return { ok: true as const, value: await retryBusy(fn) };
	} catch (e) {
		if (e instanceof DomainError) return { ok: false as const, failure: fail(e.status, { message: e.message, field: e.field ?? null }) };
		throw e;
	}
}

export const actions: Actions = {
	submit: async ({ params, locals }) => {
		const user = requireVerifiedMember();
		const { design, revision } = loadDesignRevision(params.slug, params.n, locals.user);
		const r = await run(() => submitRevision(user, revision!.id));
		if (!r.ok) return r.failure;
		redirect(303, `/designs/${design.slug}/r/${revision!.number}?submitted=1`);
	},
	withdraw: async ({ params, locals }) => {
		const user = requireVerifiedMember();
		const { design, revision } = loadDesignRevision(params.slug, params.n, locals.user);
		const r = await run(() => withdrawRevision(user, revision!.id));
		if (!r.ok) return r.failure;
		redirect(303, `/designs/${design.slug}/r/${revision!.number}`);
	},
	newRevision: async ({ params, locals }) => {
		const user = requireVerifiedMember();
		const { design } = loadDesignRevision(params.slug, params.n, locals.user);
		const r = await run(() => startRevision(user, design));
		if (!r.ok) return r.failure;
		redirect(303, `/designs/${design.slug}/r/${r.value.number}/edit`);
	}
};

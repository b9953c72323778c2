import { error, fail, redirect } from '@sveltejs/kit';
import { contentToEditor, editorToContent, readEditorForm } from '$lib/editor-state';
import { CATALOGUE_IDS } from '$lib/rf/catalogues';
import { contentOf } from '$lib/server/designs';
import { DomainError } from '$lib/server/errors';
import { requireVerifiedMember } from '$lib/server/guards';
import { isLimited } from '$lib/server/rate-limit';
import { retryBusy } from '$lib/server/db/busy';
import { readForm } from '$lib/server/forms';
import { loadDesignRevision } from '$lib/server/revision-view';
import { saveDraft, submitRevision } from '$lib/server/revisions';
import type { Actions, PageServerLoad } from './$types';

function editable(slug: string, n: string) {
	const user = requireVerifiedMember();
	const { design, revision } = loadDesignRevision(slug, n, user);
	const r = revision!;
	if (r.authorId !== user.id) error(403, 'Only the author can edit this draft.');
	if (r.state !== 'draft') error(409, `r${r.number} is ${r.state}; its content is frozen. Start a new revision to change it.`);
	return { user, design, r };
}

export const load: PageServerLoad = ({ params }) => {
	const { design, r } = editable(params.slug, params.n);
	return {
		design: { slug: design.slug, title: design.title },
		revision: { number: r.number, updatedAt: r.updatedAt.toISOString() },
		editor: contentToEditor(contentOf(r)),
		catalogues: [...CATALOGUE_IDS]
	};
};

async function save(event: Parameters<Actions[string]>[0], andSubmit: boolean) {
	const { user, design, r } = editable(event.params.slug!, event.params.n!);
	if (await isLimited('write', event)) return fail(429, { message: 'Too many saves; wait a minute.', errors: {}, editor: null });
	const editor = readEditorForm(await readForm(event));
	const parsed = editorToContent(editor);
	if (!parsed.ok) {
		return fail(400, { message: 'Nothing was saved: fix the fields marked below.', errors: parsed.errors, editor });
	}
	try {
		await retryBusy(() => saveDraft(user, r.id, parsed.content));
		if (andSubmit) await retryBusy(() => submitRevision(user, r.id));
	} catch (e) {
		if (e instanceof DomainError) {
			const saved = andSubmit && e.status === 422 ? ' The draft was saved.' : '';
			return fail(e.status, { message: e.message + saved, errors: e.field ? { [e.field]: e.message } : {}, editor });
		}
		throw e;
	}
	if (andSubmit) redirect(303, `/designs/${design.slug}/r/${r.number}?submitted=1`);
	return { saved: true, message: 'Draft saved.', errors: {}, editor: null };
}

export const actions: Actions = {
	save: (event) => save(event, false),
	submit: (event) => save(event, true)
};

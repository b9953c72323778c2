import { fail, redirect } from '@sveltejs/kit';
import { contentToEditor, editorFromForm, editorToContent } from '$lib/editor-state';
import { editorFormSchema } from '$lib/schemas/editor';
import { actionFailure, readForm } from '$lib/server/http/actions';
import { CATALOGUE_IDS } from '$lib/rf/catalogues/stock';
import { contentOf } from '$lib/server/designs/content';
import { DomainError } from '$lib/server/http/errors';
import { isLimited } from '$lib/server/http/rate-limit';
import { retryBusy } from '$lib/server/db/busy';
import { editableDraft } from '$lib/server/designs/revision-view';
import { saveDraft, submitRevision } from '$lib/server/designs/revisions';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ params }) => {
	const { design, r } = editableDraft(params.slug, params.n);
	return {
		design: { slug: design.slug, title: design.title },
		revision: { number: r.number, updatedAt: r.updatedAt.toISOString() },
		editor: contentToEditor(contentOf(r)),
		catalogues: [...CATALOGUE_IDS]
	};
};

async function save(event: Parameters<Actions[string]>[0], andSubmit: boolean) {
	const { user, design, r } = editableDraft(event.params.slug!, event.params.n!);
	if (await isLimited('write', event)) {
		return fail(429, { message: 'Too many saves; wait a minute.', errors: {}, editor: null });
	}
	const posted = await readForm(event.request, editorFormSchema);
	const editor = editorFromForm(posted.data);
	const parsed = editorToContent(editor);
	if (!parsed.ok) {
		return fail(400, {
			message: 'Nothing was saved: fix the fields marked below.',
			errors: parsed.errors,
			editor
		});
	}
	try {
		await retryBusy(() => saveDraft(user, r.id, parsed.content));
		if (andSubmit) await retryBusy(() => submitRevision(user, r.id));
	} catch (e) {
		if (!(e instanceof DomainError)) throw e;
		// A refused submit still saved the draft; the field's message also shows beside it.
		const saved = andSubmit && e.status === 422 ? ' The draft was saved.' : '';
		const errors: Record<string, string> = e.field ? { [e.field]: e.message } : {};
		return actionFailure(e, { message: e.message + saved, errors, editor });
	}
	if (andSubmit) redirect(303, `/designs/${design.slug}/r/${r.number}?submitted=1`);
	return { saved: true, message: 'Draft saved.', errors: {}, editor: null };
}

export const actions: Actions = {
	save: (event) => save(event, false),
	submit: (event) => save(event, true)
};

import { json } from '@sveltejs/kit';
import { handleApi, readJson } from '$lib/server/http/api';
import { DomainError } from '$lib/server/http/errors';
import { enforceLimit } from '$lib/server/http/rate-limit';
import { editableDraft } from '$lib/server/designs/revision-view';
import { renderMarkdown, MarkdownTooLongError } from '$lib/server/markdown/markdown';
import type { RequestHandler } from './$types';

/** The editor's preview: the draft's author sends notes, and gets them as readers will see them. */
export const POST: RequestHandler = async (event) => {
	editableDraft(event.params.slug, event.params.n);
	await enforceLimit('compute', event);
	return handleApi(async () => {
		const body = await readJson(event.request);
		const notes = (body as { notes?: unknown } | null)?.notes;
		if (typeof notes !== 'string') throw new DomainError(400, 'Send the notes as text.', 'notes');
		try {
			return json({ html: renderMarkdown(notes) });
		} catch (e) {
			if (e instanceof MarkdownTooLongError) throw new DomainError(413, e.message, 'notes');
			throw e;
		}
	});
};

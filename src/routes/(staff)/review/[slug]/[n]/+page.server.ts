import { error, fail, redirect } from '@sveltejs/kit';
import { requireUser } from '$lib/server/http/guards';
import { compareRevisions, readableRevisions } from '$lib/server/reviews/compare';
import { addComment, listThreads, noteLineCount, setResolved } from '$lib/server/reviews/comments';
import {
	confirmableRejects,
	confirmReject,
	decisionFor,
	isReviewer,
	reviewsFor,
	submitReview
} from '$lib/server/reviews/reviews';
import { actionFailure, firstProblem, readForm } from '$lib/server/http/actions';
import { isLimited } from '$lib/server/http/rate-limit';
import { retryBusy } from '$lib/server/db/busy';
import { getDesignBySlug } from '$lib/server/designs/lookups';
import { ownerName } from '$lib/server/accounts/users';
import { tableForView } from '$lib/server/designs/dimensions';
import { parseViewState } from '$lib/rf/units/view-state';
import { contentOf } from '$lib/server/designs/content';
import {
	anchorFromForm,
	commentFormSchema,
	confirmRejectFormSchema,
	resolveFormSchema,
	verdictFormSchema
} from '$lib/schemas/review';
import { canRead, getRevision } from '$lib/server/designs/lookups';
import type { Actions, PageServerLoad, RequestEvent } from './$types';

/**
 * Reviewers, and the revision's author (to answer), may open a review; everyone else gets 403.
 * Someone else's draft is hidden (404) from the page, and refused (403) to a form post.
 */
function open(event: Pick<RequestEvent, 'params' | 'locals'>, forAction = false) {
	const user = requireUser();
	const design = getDesignBySlug(event.params.slug);
	if (!design) error(404, 'No design has this address.');
	const r = /^\d{1,6}$/.test(event.params.n)
		? getRevision(design.id, Number(event.params.n))
		: null;
	if (!r) error(404, `This design has no revision r${event.params.n}.`);
	if (!canRead(user, r))
		error(
			forAction ? 403 : 404,
			forAction ? 'This draft is not yours.' : `This design has no revision r${event.params.n}.`
		);
	if (!isReviewer(user) && user.id !== r.authorId && user.id !== design.ownerId) {
		error(403, 'The review page is for reviewers and the revision’s author.');
	}
	return { user, design, r };
}

export const load: PageServerLoad = (event) => {
	const { user, design, r } = open(event);
	const previous = readableRevisions(design, user).find((h) => h.number < r.number);
	const prev = previous ? getRevision(design.id, previous.number)! : null;
	const diff = compareRevisions(prev ?? r, r, r.designHz);
	const decision = r.state === 'submitted' ? decisionFor(r) : null;
	const reviews = reviewsFor(r.id);
	const isAuthor = user.id === r.authorId || user.id === design.ownerId;
	return {
		design: { slug: design.slug, title: design.title, family: design.family },
		revision: {
			number: r.number,
			state: r.state,
			author: ownerName(r.authorId),
			changeNote: r.changeNote,
			designHz: r.designHz,
			lines: noteLineCount(r)
		},
		previousNumber: prev?.number ?? null,
		// The review reads the table at the design frequency against the claimed band: the default view.
		table: tableForView(r, parseViewState(new URLSearchParams(), r).view),
		tolerances: Object.fromEntries(
			contentOf(r)
				.rows.filter((row) => row.tolerance_mm !== undefined)
				.map((row) => [row.key, row.tolerance_mm as number])
		),
		rowKeys: contentOf(r).rows.map((row) => ({ key: row.key, label: row.label })),
		rowsDiff: diff.rows,
		notes: diff.notesSideBySide,
		notesParts: diff.notes,
		threads: listThreads(r, user),
		reviews,
		decision: decision && { state: decision.state, reason: decision.reason },
		pendingRejects: decision?.state === 'reject_pending' ? confirmableRejects(r, design, user) : [],
		can: {
			review: isReviewer(user) && !isAuthor && r.state === 'submitted',
			comment: r.state !== 'withdrawn' && r.state !== 'draft',
			isAuthor
		}
	};
};

type Values = Record<string, string | undefined>;

const tooMany = (action: string, values: Values = {}) =>
	fail(429, { action, message: 'Too many changes at once; wait a minute.', field: null, values });

export const actions: Actions = {
	comment: async (event) => {
		const { user, design, r } = open(event, true);
		const form = await readForm(event.request, commentFormSchema);
		const d = form.data;
		const values: Values = {
			body: d.body.slice(0, 25_000),
			anchor: d.anchor,
			row_key: d.row_key,
			line_start: d.line_start === undefined ? undefined : String(d.line_start),
			line_end: d.line_end === undefined ? undefined : String(d.line_end),
			parent_id: d.parent_id
		};
		if (await isLimited('write', event)) return tooMany('comment', values);
		if (!form.valid) {
			const p = firstProblem(form);
			return fail(422, {
				action: 'comment',
				message: `${p.field}: ${p.message}`,
				field: p.field,
				values
			});
		}
		let id: string;
		try {
			const anchor = anchorFromForm(d);
			const input = { body: d.body, anchor, parentId: d.parent_id || undefined };
			id = (await retryBusy(() => addComment(user, r.id, input))).id;
		} catch (e) {
			return actionFailure(e, { action: 'comment', values });
		}
		redirect(303, `/review/${design.slug}/${r.number}#comment-${id}`);
	},
	resolve: async (event) => {
		const { user, design, r } = open(event, true);
		const { data } = await readForm(event.request, resolveFormSchema);
		try {
			await retryBusy(() => setResolved(user, data.comment_id, data.resolved !== '0'));
		} catch (e) {
			return actionFailure(e, { action: 'resolve', values: {} as Values });
		}
		redirect(303, `/review/${design.slug}/${r.number}#comment-${data.comment_id}`);
	},
	review: async (event) => {
		const { user, design, r } = open(event, true);
		// The verdict is checked by submitReview with reviewSchema; the form only carries the text.
		const { data } = await readForm(event.request, verdictFormSchema);
		const values: Values = { verdict: data.verdict, summary: data.summary.slice(0, 6000) };
		if (await isLimited('write', event)) return tooMany('review', values);
		let id: string;
		try {
			const verdict = { verdict: data.verdict, summary: data.summary };
			id = (await retryBusy(() => submitReview(user, r.id, verdict))).id;
		} catch (e) {
			return actionFailure(e, { action: 'review', values });
		}
		redirect(303, `/review/${design.slug}/${r.number}#review-${id}`);
	},
	confirmReject: async (event) => {
		const { user, design, r } = open(event, true);
		const { data } = await readForm(event.request, confirmRejectFormSchema);
		try {
			await retryBusy(() => confirmReject(user, data.review_id));
		} catch (e) {
			return actionFailure(e, { action: 'confirmReject', values: {} as Values });
		}
		redirect(303, `/review/${design.slug}/${r.number}#reviews`);
	}
};

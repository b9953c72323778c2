import { error, fail, redirect } from '@sveltejs/kit';
import { requireUser } from '$lib/server/guards';
import { compareRevisions, readableRevisions } from '$lib/server/compare';
import { addComment, listThreads, noteLineCount, setResolved } from '$lib/server/comments';
import { confirmableRejects, confirmReject, decisionFor, isReviewer, reviewsFor, submitReview } from '$lib/server/reviews';
import { DomainError } from '$lib/server/errors';
import { isLimited } from '$lib/server/rate-limit';
import { retryBusy } from '$lib/server/db/busy';
import { readForm } from '$lib/server/forms';
import { getDesignBySlug, ownerName } from '$lib/server/designs';
import { claimBand, computeRevision } from '$lib/server/dimensions';
import { contentOf } from '$lib/server/designs';
import { anchorFromForm, commentFormSchema } from '$lib/schemas/review';
import { canRead, getRevision } from '$lib/server/revisions';
import type { Actions, PageServerLoad, RequestEvent } from './$types';

/**
 * Reviewers, and the revision's author (to answer), may open a review; everyone else gets 403.
 * Someone else's draft is hidden (404) from the page, and refused (403) to a form post.
 */
function open(event: Pick<RequestEvent, 'params' | 'locals'>, forAction = false) {
	const user = requireUser();
	const design = getDesignBySlug(event.params.slug);
	if (!design) error(404, 'No design has this address.');
	const r = /^\d{1,6}$/.test(event.params.n) ? getRevision(design.id, Number(event.params.n)) : null;
	if (!r) error(404, `This design has no revision r${event.params.n}.`);
	if (!canRead(user, r)) error(forAction ? 403 : 404, forAction ? 'This draft is not yours.' : `This design has no revision r${event.params.n}.`);
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
		table: computeRevision(r, { frequencyHz: r.designHz, bandHz: claimBand(r) }),
		tolerances: Object.fromEntries(contentOf(r).rows.filter((row) => row.tolerance_mm !== undefined).map((row) => [row.key, row.tolerance_mm as number])),
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

function failed(e: unknown, action: string, values: Values = {}) {
	if (e instanceof DomainError) return fail(e.status, { action, message: e.message, field: e.field ?? null, values });
	throw e;
}

const text = (data: FormData, name: string) => {
	const v = data.get(name);
	return typeof v === 'string' ? v : undefined;
};

async function limited(event: RequestEvent) {
	return isLimited('write', event);
}

export const actions: Actions = {
	comment: async (event) => {
		const { user, design, r } = open(event, true);
		const data = await readForm(event);
		const raw = {
			body: text(data, 'body') ?? '',
			anchor: text(data, 'anchor') || 'general',
			row_key: text(data, 'row_key'),
			line_start: text(data, 'line_start'),
			line_end: text(data, 'line_end'),
			parent_id: text(data, 'parent_id') || undefined
		};
		const values: Values = { body: raw.body.slice(0, 25_000), anchor: raw.anchor, row_key: raw.row_key, line_start: raw.line_start, line_end: raw.line_end, parent_id: raw.parent_id };
		if (await limited(event)) return fail(429, { action: 'comment', message: 'Too many changes at once; wait a minute.', field: null, values });
		const parsed = commentFormSchema.safeParse(raw);
		if (!parsed.success) {
			const issue = parsed.error.issues[0];
			return fail(422, { action: 'comment', message: `${issue.path.join('.')}: ${issue.message}`, field: String(issue.path[0]), values });
		}
		let id: string;
		try {
			const input = { body: parsed.data.body, anchor: anchorFromForm(parsed.data), parentId: parsed.data.parent_id };
			id = (await retryBusy(() => addComment(user, r.id, input))).id;
		} catch (e) {
			return failed(e, 'comment', values);
		}
		redirect(303, `/review/${design.slug}/${r.number}#comment-${id}`);
	},
	resolve: async (event) => {
		const { user, design, r } = open(event, true);
		const data = await readForm(event);
		try {
			await retryBusy(() => setResolved(user, text(data, 'comment_id') ?? '', text(data, 'resolved') !== '0'));
		} catch (e) {
			return failed(e, 'resolve');
		}
		redirect(303, `/review/${design.slug}/${r.number}#comment-${text(data, 'comment_id')}`);
	},
	review: async (event) => {
		const { user, design, r } = open(event, true);
		const data = await readForm(event);
		const values: Values = { verdict: text(data, 'verdict') ?? '', summary: (text(data, 'summary') ?? '').slice(0, 6000) };
		if (await limited(event)) return fail(429, { action: 'review', message: 'Too many changes at once; wait a minute.', field: null, values });
		let id: string;
		try {
			id = (await retryBusy(() => submitReview(user, r.id, { verdict: values.verdict ?? '', summary: values.summary ?? '' }))).id;
		} catch (e) {
			return failed(e, 'review', values);
		}
		redirect(303, `/review/${design.slug}/${r.number}#review-${id}`);
	},
	confirmReject: async (event) => {
		const { user, design, r } = open(event, true);
		const data = await readForm(event);
		try {
			await retryBusy(() => confirmReject(user, text(data, 'review_id') ?? ''));
		} catch (e) {
			return failed(e, 'confirmReject');
		}
		redirect(303, `/review/${design.slug}/${r.number}#reviews`);
	}
};

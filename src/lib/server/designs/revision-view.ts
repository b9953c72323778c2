import { error } from '@sveltejs/kit';
import { parseViewState } from '$lib/rf/units/view-state';
import type { Design, Revision } from '../db/schema';
import type { SessionUser } from '../accounts/auth';
import { contentOf } from './content';
import { canRead, getDesignBySlug, getRevision, listRevisions } from './lookups';
import { ownerName } from '../accounts/users';
import { tableForView } from './dimensions';
import { notesHtml } from './notes';
import { requireVerifiedMember } from '../http/guards';
import { measurementsPanelData } from '../measurements/panel';
import { reviewsPanelData } from '../reviews/reviews';

/** The design and revision a URL names, or the 404 a reader without access gets. */
export function loadDesignRevision(slug: string, n: string | undefined, user: SessionUser | null) {
	const design = getDesignBySlug(slug);
	if (!design) error(404, 'No design has this address.');
	let revision: Revision | null;
	if (n === undefined) {
		revision = null;
	} else {
		const m = /^\d{1,6}$/.test(n) ? Number(n) : NaN;
		revision = getRevision(design.id, m);
		// A draft someone else owns is hidden, not forbidden: its existence is private too.
		if (!revision || !canRead(user, revision)) error(404, `This design has no revision r${n}.`);
	}
	return { design, revision };
}

/** The draft a URL names, for its author only (the editor and its preview). */
export function editableDraft(slug: string, n: string) {
	const user = requireVerifiedMember();
	const { design, revision } = loadDesignRevision(slug, n, user);
	const r = revision!;
	if (r.authorId !== user.id) error(403, 'Only the author can edit this draft.');
	if (r.state !== 'draft') {
		error(
			409,
			`r${r.number} is ${r.state}; its content is frozen. Start a new revision to change it.`
		);
	}
	return { user, design, r };
}

export function revisionPageData(design: Design, r: Revision, url: URL, user: SessionUser | null) {
	const { view, notice } = parseViewState(url.searchParams, r);
	const content = contentOf(r);
	const table = tableForView(r, view);
	const revisions = listRevisions(design.id);
	const history = revisions
		.filter((h) => h.state !== 'draft' || h.authorId === user?.id)
		.map((h) => ({
			number: h.number,
			state: h.state,
			authorName: h.authorName,
			changeNote: h.changeNote,
			createdAt: h.createdAt.toISOString(),
			submittedAt: h.submittedAt?.toISOString() ?? null,
			decidedAt: h.decidedAt?.toISOString() ?? null
		}));
	return {
		design: {
			slug: design.slug,
			title: design.title,
			family: design.family,
			polarization: design.polarization,
			summary: design.summary,
			status: design.status,
			isDemo: design.isDemo,
			owner: ownerName(design.ownerId),
			reviewed: design.shownRevisionId !== null,
			isOwner: user?.id === design.ownerId
		},
		revision: {
			number: r.number,
			state: r.state,
			isShown: design.shownRevisionId === r.id,
			author: ownerName(r.authorId),
			changeNote: r.changeNote,
			designHz: r.designHz,
			submittedAt: r.submittedAt?.toISOString() ?? null,
			canEdit: r.state === 'draft' && r.authorId === user?.id
		},
		notesHtml: notesHtml(r),
		parameters: content.parameters,
		claim: content.claim,
		rows: content.rows.map((row) => ({ key: row.key, tolerance_mm: row.tolerance_mm ?? null })),
		table,
		view: { ...view, frequencyMessage: notice },
		history,
		...reviewsPanelData(r, user, revisions),
		...measurementsPanelData(design, r, user)
	};
}

import { error } from '@sveltejs/kit';
import { parseFrequencyParam } from '$lib/rf/units/frequency';
import { bandById } from '$lib/rf/catalogues/bands';
import type { Units } from '$lib/rf/tables/table';
import type { Design, Revision } from '../db/schema';
import type { SessionUser } from '../accounts/auth';
import { contentOf } from './content';
import { getDesignBySlug, listRevisions } from './lookups';
import { ownerName } from '../accounts/users';
import { canRead, getRevision } from './lookups';
import { claimBand, computeRevision } from './dimensions';
import { notesHtml } from './notes';
import { measurementsPanelData } from '../measurements/panel';
import { reviewsPanelData } from '../reviews/reviews';

export const UNITS: readonly Units[] = ['mm', 'in', 'in_frac'];

export function parseUnits(value: string | null): Units {
	return UNITS.includes(value as Units) ? (value as Units) : 'mm';
}

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

/** Tolerances answer "stay inside the claimed band" at the design frequency, or the chosen preset. */
export function bandFor(r: Pick<Revision, 'designHz' | 'claimLoHz' | 'claimHiHz'>, hz: number, bandId: string | null) {
	const preset = bandId ? bandById(bandId) : undefined;
	const band = preset
		? ([preset.lo_hz, preset.hi_hz] as [number, number])
		: hz === r.designHz
			? claimBand(r)
			: undefined;
	return { band, presetId: preset?.id ?? null, unknown: !!bandId && !preset };
}

/** The view state a URL asks for: ?f= (Hz or text with unit), ?units=, ?band= (preset id). */
export function viewState(url: URL, r: Revision) {
	const parsed = parseFrequencyParam(url.searchParams.get('f'), r.designHz);
	const message = parsed.message;
	let hz = parsed.hz;
	const preset = bandById(url.searchParams.get('band') ?? '');
	// Without JavaScript a newly chosen preset arrives beside the old f: outside the preset, its centre wins.
	if (preset && (hz < preset.lo_hz || hz > preset.hi_hz)) hz = preset.centre_hz;
	const { band, presetId, unknown } = bandFor(r, hz, url.searchParams.get('band'));
	return {
		frequencyHz: hz,
		frequencyMessage: message ?? (unknown ? 'Unknown band preset ignored.' : undefined),
		units: parseUnits(url.searchParams.get('units')),
		bandId: presetId,
		band
	};
}

export function revisionPageData(design: Design, r: Revision, url: URL, user: SessionUser | null) {
	const state = viewState(url, r);
	const content = contentOf(r);
	const table = computeRevision(r, { frequencyHz: state.frequencyHz, units: state.units, bandHz: state.band });
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
		view: state,
		history,
		...reviewsPanelData(r, user, revisions),
		...measurementsPanelData(design, r, user)
	};
}


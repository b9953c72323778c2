import { parseViewState } from '$lib/rf/units/view-state';
import { tableForView } from '$lib/server/designs/dimensions';
import { buildSheetPdf } from '$lib/server/designs/exports';
import { loadDesignRevision } from '$lib/server/designs/revision-view';
import { enforceLimit } from '$lib/server/http/rate-limit';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async (event) => {
	const { params, url, locals } = event;
	await enforceLimit('compute', event);
	const { design, revision } = loadDesignRevision(params.slug, params.n, locals.user);
	const { view } = parseViewState(url.searchParams, revision!);
	const table = tableForView(revision!, view);
	const paper = url.searchParams.get('paper') === 'letter' ? 'letter' : 'a4';
	const pdf = await buildSheetPdf(design, revision!, table, paper);
	const mhz = Math.round(view.frequencyHz / 1e5) / 10;
	return new Response(pdf as BodyInit, {
		headers: {
			'content-type': 'application/pdf',
			'content-disposition': `inline; filename="${design.slug}-r${revision!.number}-${mhz}MHz.pdf"`
		}
	});
};

import { computeRevision } from '$lib/server/designs/dimensions';
import { buildSheetPdf } from '$lib/server/designs/exports';
import { loadDesignRevision, viewState } from '$lib/server/designs/revision-view';
import { enforceLimit } from '$lib/server/http/rate-limit';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async (event) => {
	const { params, url, locals } = event;
	await enforceLimit('compute', event);
	const { design, revision } = loadDesignRevision(params.slug, params.n, locals.user);
	const view = viewState(url, revision!);
	const table = computeRevision(revision!, { frequencyHz: view.frequencyHz, units: view.units, bandHz: view.band });
	const pdf = await buildSheetPdf(design, revision!, table, url.searchParams.get('paper') === 'letter' ? 'letter' : 'a4');
	const mhz = Math.round(view.frequencyHz / 1e5) / 10;
	return new Response(pdf as BodyInit, {
		headers: {
			'content-type': 'application/pdf',
			'content-disposition': `inline; filename="${design.slug}-r${revision!.number}-${mhz}MHz.pdf"`
		}
	});
};

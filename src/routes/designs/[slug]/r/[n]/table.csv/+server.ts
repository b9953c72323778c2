import { computeRevision } from '$lib/server/designs/dimensions';
import { tableCsv } from '$lib/server/designs/exports';
import { loadDesignRevision, viewState } from '$lib/server/designs/revision-view';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = ({ params, url, locals }) => {
	const { design, revision } = loadDesignRevision(params.slug, params.n, locals.user);
	const view = viewState(url, revision!);
	const table = computeRevision(revision!, { frequencyHz: view.frequencyHz, units: view.units, bandHz: view.band });
	return new Response(tableCsv(table), {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="${design.slug}-r${revision!.number}.csv"`
		}
	});
};

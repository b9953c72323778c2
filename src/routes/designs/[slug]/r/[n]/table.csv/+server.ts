import { parseViewState } from '$lib/rf/units/view-state';
import { tableForView } from '$lib/server/designs/dimensions';
import { tableCsv } from '$lib/server/designs/exports';
import { loadDesignRevision } from '$lib/server/designs/revision-view';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = ({ params, url, locals }) => {
	const { design, revision } = loadDesignRevision(params.slug, params.n, locals.user);
	const { view } = parseViewState(url.searchParams, revision!);
	return new Response(tableCsv(tableForView(revision!, view)), {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="${design.slug}-r${revision!.number}.csv"`
		}
	});
};

import { designFileOf } from '$lib/server/designs/exports';
import { loadDesignRevision } from '$lib/server/designs/revision-view';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = ({ params, locals }) => {
	const { design, revision } = loadDesignRevision(params.slug, params.n, locals.user);
	return new Response(designFileOf(design, revision!), {
		headers: {
			'content-type': 'text/markdown; charset=utf-8',
			'content-disposition': `attachment; filename="${design.slug}.r${revision!.number}.md"`
		}
	});
};

import { json } from '@sveltejs/kit';
import { apiError } from '$lib/server/http/api';
import { getDesignBySlug } from '$lib/server/designs/lookups';
import { ownerName } from '$lib/server/accounts/users';
import { canRead, getRevision } from '$lib/server/designs/lookups';
import { revisionJson } from '$lib/server/designs/exports';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = ({ params, locals }) => {
	const design = getDesignBySlug(params.slug);
	const r = design ? getRevision(design.id, Number(params.n)) : null;
	if (!design || !r || !canRead(locals.user, r)) return apiError(404, 'No such design revision.');
	return json(revisionJson(design, r, ownerName(r.authorId)));
};

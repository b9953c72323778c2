import { listAudit } from '$lib/server/moderation/audit';
import { requireRole } from '$lib/server/http/guards';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = ({ url }) => {
	requireRole('moderator');
	const page = Math.max(1, Math.min(10_000, Number(url.searchParams.get('page')) || 1));
	const entries = listAudit(100, (page - 1) * 100).map((e) => ({
		...e,
		createdAt: e.createdAt.toISOString().replace('T', ' ').slice(0, 19),
		details: JSON.stringify(e.details)
	}));
	return { entries, page };
};

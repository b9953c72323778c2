import type { PageLoad } from './$types';

const metas = import.meta.glob<{ title?: string; summary?: string; order?: number }>(
	'/content/guides/*.md',
	{ eager: true, import: 'metadata' }
);

export const load: PageLoad = () => {
	const guides = Object.entries(metas)
		.map(([path, m]) => ({
			slug: path.split('/').pop()!.replace(/\.md$/, ''),
			title: m?.title ?? path,
			summary: m?.summary ?? '',
			order: m?.order ?? 99
		}))
		.sort((a, b) => a.order - b.order || a.title.localeCompare(b.title));
	return { guides };
};

import { error } from '@sveltejs/kit';
import type { Component } from 'svelte';
import type { PageLoad } from './$types';

const pages = import.meta.glob<{ default: Component; metadata?: { title?: string } }>(
	'/content/guides/*.md'
);

export const load: PageLoad = async ({ params }) => {
	const loader = pages[`/content/guides/${params.slug}.md`];
	if (!loader) error(404, 'No such guide.');
	const mod = await loader();
	return { component: mod.default, title: mod.metadata?.title ?? params.slug };
};

import { error } from '@sveltejs/kit';
import { env } from '$env/dynamic/private';
import type { LayoutServerLoad } from './$types';

// Development aids (local mail, component sheet) do not exist in production.
export const load: LayoutServerLoad = () => {
	if (env.NODE_ENV === 'production') error(404, 'Not found');
};

import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

/** Liveness probe; also the benchmark's baseline for a trivial SvelteKit JSON route. */
export const GET: RequestHandler = () => json({ ok: true, service: 'bandwright' });

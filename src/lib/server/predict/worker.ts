/**
 * Worker-thread side of pool.ts. In the main thread importing this module only tells the
 * pool where the module lives (after `vite build` it is its own chunk, with its own URL); in a
 * worker started by the pool it answers `{ id, request }` messages with `{ id, response }`.
 */
import { isMainThread, parentPort, workerData } from 'node:worker_threads';
import { predict } from '$lib/rf/model/predict';

export const WORKER_ROLE = 'bandwright-predict';
export const workerUrl = import.meta.url;

if (!isMainThread && parentPort && workerData?.role === WORKER_ROLE) {
	const port = parentPort;
	port.on('message', (m: { id: number; request: unknown }) => {
		try {
			port.postMessage({ id: m.id, response: predict(m.request) });
		} catch (e) {
			port.postMessage({ id: m.id, failure: e instanceof Error ? e.message : String(e) });
		}
	});
}

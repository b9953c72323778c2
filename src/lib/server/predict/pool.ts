import { availableParallelism } from 'node:os';
import { Worker } from 'node:worker_threads';
import type { PredictResponse } from '$lib/rf/model/predict';

/**
 * Runs wire-model predictions (`predict` from rf/model) on worker threads, so that one large
 * model cannot stall the request thread: a few workers, a bounded queue (a full queue refuses at
 * once, for a 503), and a time limit per job after which its worker is terminated and replaced.
 * The worker module is found through its own `import.meta.url` (see worker.ts), which
 * `vite build` keeps as a separate chunk; under Vite's dev server and in tests the module is
 * TypeScript, so workers start with the tsx loader.
 */

export type PoolFailure = 'busy' | 'timeout' | 'crashed' | 'closed';

export class PredictPoolError extends Error {
	constructor(
		readonly code: PoolFailure,
		message: string
	) {
		super(message);
	}
}

export interface PredictPoolOptions {
	/** Worker threads; default: available cores − 1, at least 1, at most 4. */
	size?: number;
	/** Jobs waiting beyond the running ones before new ones are refused. */
	maxQueue?: number;
	/** Milliseconds one job may run. */
	timeoutMs?: number;
}

interface Job {
	id: number;
	request: unknown;
	resolve: (r: PredictResponse) => void;
	reject: (e: PredictPoolError) => void;
}

interface Slot {
	worker: Worker;
	job: Job | null;
	timer: NodeJS.Timeout | null;
}

export interface PredictPool {
	run(request: unknown): Promise<PredictResponse>;
	stats(): { workers: number; busy: number; queued: number; completed: number; failed: number };
	close(): Promise<void>;
}

export async function createPredictPool(options: PredictPoolOptions = {}): Promise<PredictPool> {
	const size = options.size ?? Math.max(1, Math.min(4, availableParallelism() - 1));
	const maxQueue = options.maxQueue ?? 16;
	const timeoutMs = options.timeoutMs ?? 20_000;
	const { workerUrl, WORKER_ROLE } = await import('./worker');
	const url = new URL(workerUrl);
	const typescript = url.pathname.endsWith('.ts');
	const queue: Job[] = [];
	const slots: Slot[] = [];
	let nextId = 1;
	let completed = 0;
	let failed = 0;
	let closed = false;

	const settle = (slot: Slot, fn: (job: Job) => void) => {
		const job = slot.job;
		if (slot.timer) clearTimeout(slot.timer);
		slot.job = null;
		slot.timer = null;
		if (job) fn(job);
	};

	const spawn = (): Slot => {
		const workerData = { role: WORKER_ROLE };
		// TypeScript (dev server, tests): load the module through tsx inside the worker
		const boot = `import('tsx/esm/api').then(({ tsImport }) => tsImport(${JSON.stringify(url.href)}, ${JSON.stringify(url.href)}));`;
		const worker = typescript
			? new Worker(boot, { eval: true, workerData, execArgv: [] })
			: new Worker(url, { workerData });
		const slot: Slot = { worker, job: null, timer: null };
		worker.unref();
		worker.on('message', (m: { id: number; response?: PredictResponse; failure?: string }) => {
			if (slot.job?.id !== m.id) return;
			settle(slot, (job) => {
				if (m.response) {
					completed++;
					job.resolve(m.response);
				} else {
					failed++;
					job.reject(new PredictPoolError('crashed', m.failure ?? 'the prediction failed'));
				}
			});
			pump();
		});
		const replace = (why: string) => {
			const i = slots.indexOf(slot);
			if (i < 0) return;
			slots.splice(i, 1);
			settle(slot, (job) => {
				failed++;
				job.reject(new PredictPoolError('crashed', why));
			});
			if (!closed) {
				slots.push(spawn());
				pump();
			}
		};
		worker.on('error', (e) => replace(e.message));
		worker.on('exit', (code) => replace(`the worker stopped (exit code ${code})`));
		return slot;
	};

	const pump = () => {
		for (const slot of slots) {
			if (slot.job || queue.length === 0) continue;
			const job = queue.shift()!;
			slot.job = job;
			slot.timer = setTimeout(() => {
				const i = slots.indexOf(slot);
				if (i >= 0) slots.splice(i, 1);
				settle(slot, (j) => {
					failed++;
					j.reject(
						new PredictPoolError('timeout', `the prediction took longer than ${timeoutMs / 1000} s`)
					);
				});
				void slot.worker.terminate();
				if (!closed) {
					slots.push(spawn());
					pump();
				}
			}, timeoutMs);
			slot.worker.postMessage({ id: job.id, request: job.request });
		}
	};

	for (let i = 0; i < size; i++) slots.push(spawn());

	return {
		run(request) {
			if (closed)
				return Promise.reject(new PredictPoolError('closed', 'the prediction pool is closed'));
			const busy = slots.filter((s) => s.job).length;
			if (busy >= slots.length && queue.length >= maxQueue)
				return Promise.reject(
					new PredictPoolError('busy', 'too many predictions are waiting; try again shortly')
				);
			return new Promise<PredictResponse>((resolve, reject) => {
				queue.push({ id: nextId++, request, resolve, reject });
				pump();
			});
		},
		stats: () => ({
			workers: slots.length,
			busy: slots.filter((s) => s.job).length,
			queued: queue.length,
			completed,
			failed
		}),
		async close() {
			closed = true;
			for (const job of queue.splice(0))
				job.reject(new PredictPoolError('closed', 'the prediction pool is closed'));
			await Promise.all(
				slots.splice(0).map((s) => {
					settle(s, (job) =>
						job.reject(new PredictPoolError('closed', 'the prediction pool is closed'))
					);
					return s.worker.terminate();
				})
			);
		}
	};
}

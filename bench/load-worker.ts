/**
 * One load run in its own process (started by load() in bench/server.ts): reads its job as JSON on
 * stdin, runs a one-second warm-up and then the measured run, prints the result as JSON.
 */
import autocannon from 'autocannon';
import type { LoadOptions, LoadResult } from './server';

interface Job extends LoadOptions {
	url: string;
	seconds: number;
}

async function readJob(): Promise<Job> {
	let text = '';
	for await (const chunk of process.stdin) text += chunk;
	return JSON.parse(text) as Job;
}

/**
 * `{f}` → frequencies no request used before, spread over 2.3–6 GHz like the repeated ones: the
 * i-th is 2.3 GHz + (i × 1 000 003 mod 3 700 000) kHz, distinct for 3.7 million requests (the step is
 * prime to the modulus).
 */
function freshRequests(method: string, template: NonNullable<LoadOptions['fresh']>) {
	let i = 0;
	return [
		{
			method,
			setupRequest: (req: object) => {
				const f = String(2.3e9 + ((i++ * 1_000_003) % 3_700_000) * 1e3);
				return {
					...req,
					...(template.path ? { path: template.path.replaceAll('{f}', f) } : {}),
					...(template.body ? { body: template.body.replaceAll('{f}', f) } : {})
				};
			}
		}
	];
}

function run(job: Job, seconds: number) {
	const method = job.method ?? 'GET';
	const requests = job.fresh
		? freshRequests(method, job.fresh)
		: job.variants?.map((v) => ({ method, ...v }));
	return autocannon({
		url: job.url,
		connections: 50,
		duration: seconds,
		method,
		// The per-browser limiter refuses requests without a user agent.
		headers: {
			'user-agent': 'bandwright-bench',
			...(method === 'POST' ? { 'content-type': 'application/json' } : {})
		},
		...(requests ? { requests } : {})
	});
}

const job = await readJob();
await run(job, 1);
const r = await run(job, job.seconds);
const result: LoadResult = {
	rps: r.requests.average,
	p50: r.latency.p50,
	p99: r.latency.p99,
	errors: r.errors,
	non2xx: r.non2xx
};
process.stdout.write(JSON.stringify(result));

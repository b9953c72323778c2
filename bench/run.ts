/**
 * npm run bench — prints the figures the issues set targets for. Needs a production build
 * (npm run build). Load tests hit 127.0.0.1 only, 50 connections, a few seconds each.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { benchEngine, BENCH_TABLE } from './engine';
import { benchSweep } from './sweep';
import { benchMeasurements } from './measurements';
import { benchModel } from './model';
import { frequencies, load, startBareServer, startBuiltServer } from './server';
import type { RevisionContent } from '../src/lib/schemas/design';

const SECONDS = Number(process.env.BENCH_SECONDS ?? 5);
// BENCH_PORT (and the port after it) let parallel work run side by side.
const PORT = Number(process.env.BENCH_PORT ?? 4401);
const dataDir = mkdtempSync(join(tmpdir(), 'bandwright-bench-'));
process.env.DATABASE_URL = join(dataDir, 'bench.db');
process.env.DATA_DIR = dataDir;

const line = (label: string, value: string) => console.log(`${label.padEnd(58)} ${value}`);
const ratio = (a: number, b: number) => `${((100 * a) / b).toFixed(0)} %`;

function benchContent(): RevisionContent {
	const unitOf = (v: number | string) => {
		if (typeof v === 'number') return { value: v };
		const [n, u] = v.split(' ');
		return { value: Number(n), unit: u };
	};
	return {
		design_frequency_hz: 2.45e9,
		parameters: BENCH_TABLE.parameters.map((p) => ({
			key: p.key,
			label: p.key,
			...unitOf(p.value)
		})),
		rows: BENCH_TABLE.rows.map((r) => ({
			key: r.key,
			label: r.label ?? r.key,
			formula: r.formula,
			kind: r.kind,
			...(r.catalogue ? { catalogue: r.catalogue } : {})
		})),
		claim: { centre_hz: 2.45e9, band_lo_hz: 2.4e9, band_hi_hz: 2.5e9, vswr_max: 2 },
		notes:
			'Benchmark design (generated, not a real design).\n\n' +
			'Cut, bend, solder and measure. '.repeat(200),
		change_note: 'bench'
	};
}

// `npm run bench -- http search` runs only the named sections (engine, sweeps, model, photos, http, search).
const SECTIONS = new Set(process.argv.slice(2));
const wanted = (name: string) => SECTIONS.size === 0 || SECTIONS.has(name);

async function main() {
	if (wanted('engine')) {
		console.log('== dimension engine (in process)');
		for (const [k, v] of Object.entries(await benchEngine())) line(k, v.toFixed(1));
	}
	if (wanted('sweeps')) {
		console.log('== sweeps (in process)');
		for (const [k, v] of Object.entries(await benchSweep())) line(k, v.toFixed(1));
	}
	if (wanted('model')) {
		console.log('== wire model solver (in process)');
		await benchModel(line);
	}
	if (wanted('photos')) {
		console.log('== photos (in process)');
		for (const [k, v] of Object.entries(await benchMeasurements())) line(k, v.toFixed(1));
	}
	if (!wanted('http') && !wanted('search')) return;

	// Fixtures through the server's own modules (after DATABASE_URL is set).
	const { seedDemo } = await import('../src/lib/server/seed/demo');
	const { createDesign } = await import('../src/lib/server/designs/designs');
	const { submitRevision } = await import('../src/lib/server/designs/revisions');
	const { findUserByEmail } = await import('../src/lib/server/accounts/accounts');
	const { toSessionUser } = await import('../src/lib/server/accounts/auth');
	const { benchSearch } = await import('./search');
	await seedDemo(() => {});
	const owner = toSessionUser(findUserByEmail('priya@lanternhill.example')!);
	const bench = createDesign(
		owner,
		{
			title: 'Bench forty-row design',
			slug: 'bench-forty',
			family: 'biquad',
			polarization: 'linear',
			summary: 'generated'
		},
		benchContent()
	);
	submitRevision(owner, bench.revisionId);

	if (wanted('http')) await benchHttp();
	if (wanted('search')) {
		console.log('== search over 10 000 generated designs (in process)');
		for (const [k, v] of Object.entries(await benchSearch(owner))) line(k, v.toFixed(2));
	}
	rmSync(dataDir, { recursive: true, force: true });
}

async function benchHttp() {
	console.log('== HTTP (autocannon -c 50, %d s each after 1 s warm-up, loopback)', SECONDS);
	const bare = await startBareServer(PORT + 1);
	const bareR = await load(`http://127.0.0.1:${PORT + 1}/`, SECONDS);
	bare.kill();
	const server = await startBuiltServer(PORT, {
		DATABASE_URL: process.env.DATABASE_URL!,
		DATA_DIR: dataDir,
		RATE_LIMIT_FACTOR: '1000000',
		BENCH_ROUTES: '1'
	});
	try {
		const u = (p: string) => `http://127.0.0.1:${PORT}${p}`;
		const healthFirst = await load(u('/api/v1/health'), SECONDS);
		// Context, not a target: the cheapest SSR page this app has (layout, hooks, CSP nonce, no data).
		const home = await load(u('/'), SECONDS);
		// Two loads for each measured route: 64 target frequencies (2.3–6 GHz) repeating, as readers
		// choosing common bands and following shared links do; and a frequency nobody asked for before
		// on every request, so that what the server keeps (page cache, kept API answers) cannot answer.
		const fs = frequencies(2.3e9, 6e9);
		// f: a number, or "{f}" where the load worker puts a new frequency into each request.
		const table = JSON.stringify({ parameters: BENCH_TABLE.parameters, rows: BENCH_TABLE.rows });
		const evalBody = (f: number | string) => `{"frequency_hz":${f},${table.slice(1)}`;
		const dimsPath = (f: number | string) =>
			`/api/v1/designs/bench-forty/revisions/1/dimensions?f=${f}`;
		const pagePath = (f: number | string) => `/designs/bench-forty?f=${f}`;
		const evaluate = await load(u('/api/v1/evaluate'), SECONDS, {
			method: 'POST',
			variants: fs.map((f) => ({ body: evalBody(f) }))
		});
		// The floor under the evaluate API: the same rate limit and 3 kB body read and parsed, nothing computed.
		const postFloor = await load(u('/dev/bench/post-floor'), SECONDS, {
			method: 'POST',
			variants: fs.map((f) => ({ body: evalBody(f) }))
		});
		const evaluateFresh = await load(u('/api/v1/evaluate'), SECONDS, {
			method: 'POST',
			fresh: { body: evalBody('{f}') }
		});
		const dims = await load(u(dimsPath(2.45e9)), SECONDS, {
			variants: fs.map((f) => ({ path: dimsPath(f) }))
		});
		const dimsFresh = await load(u(dimsPath(2.45e9)), SECONDS, {
			fresh: { path: dimsPath('{f}') }
		});
		const pageR = await load(u(pagePath(2.45e9)), SECONDS, {
			variants: fs.map((f) => ({ path: pagePath(f) }))
		});
		const pageFresh = await load(u(pagePath(2.45e9)), SECONDS, {
			fresh: { path: pagePath('{f}') }
		});
		// Health again at the end: ratios use the mean of both runs, so drift during the run cancels.
		const healthLast = await load(u('/api/v1/health'), SECONDS);
		const health = { rps: (healthFirst.rps + healthLast.rps) / 2 };
		const of = (r: { rps: number }, target?: string) =>
			`${r.rps.toFixed(0)}  = ${ratio(r.rps, health.rps)} of health${target ? ` (target ≥ ${target})` : ''}`;
		line('bare node:http (machine ceiling) req/s', bareR.rps.toFixed(0));
		line(
			'trivial SvelteKit JSON route /api/v1/health req/s',
			`${health.rps.toFixed(0)}  (first ${healthFirst.rps.toFixed(0)}, last ${healthLast.rps.toFixed(0)}, p50 ${healthFirst.p50} ms)`
		);
		line('home page SSR (the framework floor for a page) req/s', `${of(home)} (context)`);
		line('POST floor: rate limit + read and parse the same body', `${of(postFloor)} (context)`);
		line('POST /api/v1/evaluate, 40 rows, 64 frequencies, req/s', of(evaluate, '50 %'));
		line('  … a new frequency every request', of(evaluateFresh));
		line('GET dimensions API, 40 rows, 64 frequencies, req/s', of(dims, '40 %'));
		line('  … a new frequency every request (computed each time)', of(dimsFresh));
		line('design page, no session, 64 frequencies, req/s', of(pageR, '25 %'));
		line('  … a new frequency every request (SSR each time)', of(pageFresh));
		for (const [name, r] of Object.entries({
			healthFirst,
			healthLast,
			home,
			postFloor,
			evaluate,
			evaluateFresh,
			dims,
			dimsFresh,
			page: pageR,
			pageFresh
		})) {
			if (r.errors || r.non2xx)
				console.log(`  warning: ${name} had ${r.errors} errors and ${r.non2xx} non-2xx answers`);
		}
	} finally {
		server.kill();
	}
}

main().catch((e) => {
	console.error(e);
	process.exit(1);
});

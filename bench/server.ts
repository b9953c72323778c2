/** Helpers to run the built server and load generators on loopback only, bounded in time. */
import { spawn, type ChildProcess } from 'node:child_process';

async function waitFor(url: string, timeoutMs = 30_000): Promise<void> {
	const until = Date.now() + timeoutMs;
	while (Date.now() < until) {
		try {
			if ((await fetch(url)).ok) return;
		} catch {
			/* not up yet */
		}
		await new Promise((r) => setTimeout(r, 200));
	}
	throw new Error(`${url} did not come up`);
}

export async function startBuiltServer(
	port: number,
	env: Record<string, string>
): Promise<ChildProcess> {
	const child = spawn(process.execPath, [process.env.BUILD_DIR || 'build'], {
		env: { ...process.env, ...env, PORT: String(port), ORIGIN: `http://127.0.0.1:${port}` },
		stdio: ['ignore', 'ignore', 'inherit']
	});
	await waitFor(`http://127.0.0.1:${port}/api/v1/health`);
	return child;
}

/** A bare node:http server in its own process (so it does not share a core with the load generator). */
export async function startBareServer(port: number): Promise<ChildProcess> {
	const code = `require('node:http').createServer((q, s) => { s.writeHead(200, { 'content-type': 'application/json' }); s.end('{"ok":true}'); }).listen(${port}, '127.0.0.1')`;
	const child = spawn(process.execPath, ['-e', code], { stdio: 'ignore' });
	await waitFor(`http://127.0.0.1:${port}/`);
	return child;
}

export interface LoadResult {
	rps: number;
	p50: number;
	p99: number;
	errors: number;
	non2xx: number;
}

/** A request in a load run's cycle: its path (with query) and, for POST, its body. */
interface Variant {
	path?: string;
	body?: string;
}

export interface LoadOptions {
	method?: 'GET' | 'POST';
	/** Each connection cycles through these (e.g. 64 frequencies, as readers repeating common bands). */
	variants?: Variant[];
	/**
	 * A request nobody sent before, every time, so nothing the server kept can answer it: `{f}` in
	 * the path or body becomes a new frequency in 2.3–6 GHz for each request (bench/load-worker.ts).
	 */
	fresh?: Variant;
}

/**
 * autocannon against 127.0.0.1 only: 50 connections for `seconds` (bounded), after a one-second
 * warm-up that is not counted (first requests load modules lazily and let V8 optimise). It runs in
 * a process of its own (bench/load-worker.ts), so the bench's own heap and collections do not
 * slow the load generator between one measurement and the next.
 */
export async function load(
	url: string,
	seconds: number,
	opts: LoadOptions = {}
): Promise<LoadResult> {
	if (!url.startsWith('http://127.0.0.1:')) throw new Error('benchmarks only target loopback');
	const child = spawn(process.execPath, ['--import', 'tsx', 'bench/load-worker.ts'], {
		stdio: ['pipe', 'pipe', 'inherit']
	});
	child.stdin!.end(JSON.stringify({ url, seconds, ...opts }));
	let out = '';
	child.stdout!.on('data', (d) => (out += d));
	const code = await new Promise<number | null>((done) => child.on('close', done));
	if (code !== 0) throw new Error(`load worker for ${url} exited with ${code}`);
	return JSON.parse(out) as LoadResult;
}

/** `count` frequencies spread over [lo, hi] Hz, rounded to 1 kHz. */
export function frequencies(lo: number, hi: number, count = 64): number[] {
	return Array.from(
		{ length: count },
		(_, i) => Math.round((lo + ((hi - lo) * i) / (count - 1)) / 1e3) * 1e3
	);
}

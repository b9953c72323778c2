// A second server process for tests that must start, kill or configure a server themselves (the
// shared one from playwright.config.ts stays untouched). Each gets its own data folder and port.
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { createServer, type AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

export interface ServerProcess {
	url: string;
	dataDir: string;
	child: ChildProcess;
	/** Everything the process wrote to stdout and stderr so far. */
	output(): string;
	/** Ends the process (SIGKILL simulates a crash) and waits for it to exit. */
	stop(signal?: NodeJS.Signals): Promise<void>;
}

/**
 * A port nobody listens on, chosen by the OS: ports next to E2E_PORT may be another run's, and a
 * server found there would answer this test's health check in its place.
 */
export async function freePort(): Promise<number> {
	const probe = createServer();
	await new Promise<void>((resolve) => probe.listen(0, resolve));
	const { port } = probe.address() as AddressInfo;
	await new Promise((resolve) => probe.close(resolve));
	return port;
}

export const newDataDir = (name: string) => mkdtempSync(join(tmpdir(), `bandwright-${name}-`));

/** Starts `node build` with exactly `env` (plus PATH) and waits until it answers. */
export async function startServer(
	env: Record<string, string | undefined>,
	dataDir: string
): Promise<ServerProcess> {
	const port = Number(env.PORT);
	const url = `http://localhost:${port}`;
	let out = '';
	const child = spawn(process.execPath, [process.env.BUILD_DIR || 'build'], {
		env: { PATH: process.env.PATH, ...env },
		stdio: ['ignore', 'pipe', 'pipe']
	});
	child.stdout!.on('data', (d) => (out += d));
	child.stderr!.on('data', (d) => (out += d));
	const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
	const deadline = Date.now() + 30_000;
	for (;;) {
		if (child.exitCode !== null) throw new Error(`server exited at start:\n${out}`);
		try {
			if ((await fetch(`${url}/api/v1/health`)).ok) break;
		} catch {
			// not listening yet
		}
		if (Date.now() > deadline) {
			child.kill('SIGKILL');
			throw new Error(`server did not answer within 30 s:\n${out}`);
		}
		await new Promise((r) => setTimeout(r, 100));
	}
	return {
		url,
		dataDir,
		child,
		output: () => out,
		async stop(signal = 'SIGTERM') {
			if (child.exitCode === null && child.signalCode === null) child.kill(signal);
			await exited;
		}
	};
}

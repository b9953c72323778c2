// npm start: build when needed, migrate and seed an empty database, then serve on :3000.
import { spawnSync, spawn } from 'node:child_process';
import { existsSync, statSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { startEnv } from './start-env.js';

const env = startEnv();

function newestMtime(dir) {
	let newest = 0;
	for (const entry of readdirSync(dir, { withFileTypes: true })) {
		const p = join(dir, entry.name);
		newest = Math.max(newest, entry.isDirectory() ? newestMtime(p) : statSync(p).mtimeMs);
	}
	return newest;
}

const built = existsSync('build/index.js');
const stale =
	built &&
	['src', 'content', 'static'].some((d) => newestMtime(d) > statSync('build/index.js').mtimeMs);
if (!built || stale) {
	console.log(built ? 'Sources changed since the last build: building…' : 'Building Bandwright…');
	const r = spawnSync('npm', ['run', 'build'], { stdio: 'inherit', env });
	if (r.status !== 0) process.exit(r.status ?? 1);
}

if (env.SEED_DEMO !== '0') {
	const r = spawnSync(
		'npx',
		['tsx', '--tsconfig', 'scripts/tsconfig.json', 'scripts/seed-if-empty.ts'],
		{
			stdio: 'inherit',
			env
		}
	);
	if (r.status !== 0) process.exit(r.status ?? 1);
}

console.log(`Bandwright on ${env.ORIGIN}`);
const server = spawn(process.execPath, ['build'], { stdio: 'inherit', env });
for (const sig of ['SIGINT', 'SIGTERM']) process.on(sig, () => server.kill(sig));
server.on('exit', (code) => process.exit(code ?? 0));

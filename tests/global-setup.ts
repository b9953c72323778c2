import { execFileSync } from 'node:child_process';
import { join } from 'node:path';

// Seed the throw-away database through the same script `npm start` uses.
export default function globalSetup() {
	const dataDir = process.env.E2E_DATA_DIR!;
	execFileSync('npx', ['tsx', '--tsconfig', 'scripts/tsconfig.json', 'scripts/seed-if-empty.ts'], {
		stdio: 'inherit',
		env: { ...process.env, DATABASE_URL: join(dataDir, 'bandwright.db'), DATA_DIR: dataDir }
	});
}

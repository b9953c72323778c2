import { defineConfig, devices } from '@playwright/test';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

// One throw-away data folder (database, outbox, files) per run, shared with the specs via env.
const dataDir = process.env.E2E_DATA_DIR ?? mkdtempSync(join(tmpdir(), 'bandwright-e2e-'));
process.env.E2E_DATA_DIR = dataDir;
const port = Number(process.env.E2E_PORT ?? 4173);

export default defineConfig({
	testDir: 'tests',
	fullyParallel: false,
	workers: 1,
	retries: 0,
	forbidOnly: true,
	reporter: [['list']],
	timeout: 60_000,
	use: {
		baseURL: `http://localhost:${port}`,
		trace: 'off',
		launchOptions: {
			executablePath: '/usr/bin/chromium',
			args: [
				'--headless',
				'--no-sandbox',
				'--disable-gpu',
				'--disable-quic',
				'--no-first-run',
				'--disable-background-networking',
				'--disable-component-update',
				'--disable-sync'
			]
		}
	},
	projects: [{ name: 'chromium', use: { ...devices['Desktop Chrome'] } }],
	webServer: {
		command: `node ${process.env.BUILD_DIR || 'build'}`,
		port,
		reuseExistingServer: false,
		timeout: 60_000,
		env: {
			PORT: String(port),
			ORIGIN: `http://localhost:${port}`,
			DATABASE_URL: join(dataDir, 'bandwright.db'),
			DATA_DIR: dataDir,
			RATE_LIMIT_FACTOR: '3',
			BODY_SIZE_LIMIT: '16M',
			SEED_DEMO: '1'
		}
	},
	globalSetup: './tests/global-setup.ts'
});

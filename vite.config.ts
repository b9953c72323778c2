import { sveltekit } from '@sveltejs/kit/vite';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vitest/config';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

// Each test file gets its own module graph, so each gets its own in-memory database. Set before
// the SvelteKit plugin reads the environment for $env/dynamic/private.
const UNIT_ENV = { DATABASE_URL: ':memory:', DATA_DIR: join(tmpdir(), 'bandwright-unit') };
if (process.env.VITEST) Object.assign(process.env, UNIT_ENV);

export default defineConfig({
	plugins: [tailwindcss(), sveltekit()],
	// Fonts ship as files: the CSP allows font-src 'self', not data: URLs.
	build: { assetsInlineLimit: 0 },
	test: {
		include: ['src/**/*.test.ts', 'scripts/**/*.test.ts'],
		environment: 'node',
		expect: { requireAssertions: true },
		testTimeout: 20000,
		env: UNIT_ENV
	}
});

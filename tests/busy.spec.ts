import { expect, test } from '@playwright/test';
import Database from 'better-sqlite3';
import { join } from 'node:path';
import { BASE, DEMO, signIn, unique } from './helpers';
import { importDesign } from './http-helpers';

const FORM = { origin: BASE, accept: 'text/html' };

/** A second process (this test runner) holding SQLite's write lock on the server's database. */
function holdWriteLock() {
	const lock = new Database(join(process.env.E2E_DATA_DIR!, 'bandwright.db'));
	lock.exec('BEGIN IMMEDIATE');
	return {
		release() {
			if (lock.inTransaction) lock.exec('ROLLBACK');
			lock.close();
		}
	};
}

// The first render of a listing loads the formula engine: seconds on a busy machine, not what is measured here.
test.beforeAll(async ({ request }) => {
	await request.get('/designs');
});

test('while another process holds the write lock, reads stay quick and writes answer 503 with Retry-After, not 500', async ({
	page,
	playwright
}) => {
	await signIn(page, DEMO.author);
	const { slug } = await importDesign(page.request, BASE);
	await page.goto(`/designs/${slug}/r/1/edit`);
	const fields = await page
		.locator('form[action="?/save"]')
		.evaluate((f) => [...new FormData(f as HTMLFormElement)].map(([k, v]) => [k, String(v)]));
	const anon = await playwright.request.newContext({
		baseURL: BASE,
		userAgent: unique('busy'),
		extraHTTPHeaders: FORM
	});

	const lock = holdWriteLock();
	try {
		const started = Date.now();
		const signingIn = anon.post('/signin', { form: DEMO.member, maxRedirects: 0 });
		const saving = page.request.post(`/designs/${slug}/r/1/edit?/save`, {
			data: new URLSearchParams(fields).toString(),
			headers: { ...FORM, 'content-type': 'application/x-www-form-urlencoded' },
			maxRedirects: 0
		});
		// The health route keeps answering while both writes wait: nothing blocks the event loop.
		const health: number[] = [];
		while (Date.now() - started < 1500) {
			const t = Date.now();
			expect((await anon.get('/api/v1/health')).status()).toBe(200);
			health.push(Date.now() - t);
		}
		const [signin, save] = await Promise.all([signingIn, saving]);
		for (const res of [signin, save]) {
			expect(res.status(), res.url()).toBe(503);
			expect(Number(res.headers()['retry-after']), res.url()).toBeGreaterThan(0);
		}
		expect(Date.now() - started).toBeLessThan(5000);
		expect(Math.max(...health)).toBeLessThan(1000);
	} finally {
		lock.release();
	}
	// Once the lock is gone, the same sign-in works.
	expect((await anon.post('/signin', { form: DEMO.member, maxRedirects: 0 })).status()).toBe(303);
	await anon.dispose();
});

test('a write that meets a short lock waits for it and then succeeds', async ({ page }) => {
	await signIn(page, DEMO.author);
	const { slug } = await importDesign(page.request, BASE);
	await page.goto(`/designs/${slug}/r/1/edit`);
	await page.waitForLoadState('networkidle');
	const lock = holdWriteLock();
	const released = new Promise<void>((resolve) =>
		setTimeout(() => {
			lock.release();
			resolve();
		}, 700)
	);
	try {
		await page.getByRole('button', { name: 'Save draft' }).click();
		await expect(page.getByTestId('editor-message')).toHaveText('Draft saved.');
	} finally {
		await released;
	}
});

import { expect, test, type Page } from '@playwright/test';
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { startEnv } from '../scripts/start-env.js';
import { BASE, DEMO, lastLinkTo, signIn, unique } from './helpers';
import { importDesign } from './http-helpers';
import { newDataDir, freePort, startServer } from './server-process';

const FORM = { origin: BASE, accept: 'text/html' };
/** A visitor who is not on the server's own machine, as a reverse proxy would present them. */
const REMOTE = { 'x-forwarded-for': '203.0.113.7' };

const offSite = (location: string | undefined) =>
	new URL(location ?? '', `${BASE}/signin`).origin !== BASE;

test.describe('open redirect after sign-in', () => {
	// A few of the bypasses src/lib/server/http/safe-next.test.ts checks one by one, here through the server.
	const NEXTS = [
		'/\t/evil.example/phish',
		'/\\evil.example',
		'/.//evil.example',
		'/%2e//evil.example',
		'/\r\nSet-Cookie: a=b'
	];

	test('a "next" with a tab, newline, backslash or dot segment never leads off-site, and CR/LF never gives a 500', async ({
		playwright
	}) => {
		const ctx = await playwright.request.newContext({
			baseURL: BASE,
			userAgent: unique('next-probe'),
			extraHTTPHeaders: FORM
		});
		for (const next of NEXTS) {
			const page = await ctx.get(`/signin?next=${encodeURIComponent(next)}`);
			expect(page.status(), JSON.stringify(next)).toBe(200);
			const hidden = /name="next" value="([^"]*)"/.exec(await page.text())?.[1] ?? '';
			expect(offSite(hidden.replace(/&amp;/g, '&')), JSON.stringify(next)).toBe(false);

			const res = await ctx.post('/signin', { form: { ...DEMO.member, next }, maxRedirects: 0 });
			expect(res.status(), JSON.stringify(next)).toBe(303);
			expect(
				offSite(res.headers()['location']),
				`${JSON.stringify(next)} → ${res.headers()['location']}`
			).toBe(false);
			// Signed in now: the sign-in page itself redirects to `next`.
			const again = await ctx.get(`/signin?next=${encodeURIComponent(next)}`, { maxRedirects: 0 });
			expect(again.status(), JSON.stringify(next)).toBe(303);
			expect(offSite(again.headers()['location']), JSON.stringify(next)).toBe(false);
		}
		await ctx.dispose();
	});

	test('signing in from a link with a tab in next stays on the site', async ({ page }) => {
		await page.goto('/signin?next=%2F%09%2Fevil.example%2Fphish');
		await page.getByLabel('E-mail').fill(DEMO.member.email);
		await page.getByLabel('Password').fill(DEMO.member.password);
		await page.getByRole('button', { name: 'Sign in' }).click();
		await expect(page.getByTestId('signed-in-as')).toBeVisible();
		expect(new URL(page.url()).origin).toBe(BASE);
	});
});

test.describe('mail is only for the operator', () => {
	test('the outbox page answers the machine itself or a signed-in moderator, never a remote visitor or member', async ({
		browser,
		request
	}) => {
		expect((await request.get('/dev/mail')).status()).toBe(200);
		expect((await request.get('/dev/mail', { headers: REMOTE })).status()).toBe(404);
		expect(
			(await request.get('/dev/mail', { headers: { forwarded: 'for=203.0.113.7' } })).status()
		).toBe(404);
		const as = async (who: { email: string; password: string }) => {
			const page = await (await browser.newContext()).newPage();
			await signIn(page, who);
			const status = (await page.request.get('/dev/mail', { headers: REMOTE })).status();
			await page.context().close();
			return status;
		};
		expect(await as(DEMO.author)).toBe(404);
		expect(await as(DEMO.reviewer)).toBe(404);
		expect(await as(DEMO.moderator)).toBe(200);
	});

	test('an anonymous remote visitor cannot take an account over through the outbox', async ({
		playwright
	}) => {
		const ctx = await playwright.request.newContext({
			baseURL: BASE,
			userAgent: unique('takeover'),
			extraHTTPHeaders: { ...FORM, ...REMOTE }
		});
		const ask = await ctx.post('/reset', {
			form: { email: DEMO.moderator.email },
			maxRedirects: 0
		});
		expect(ask.status()).toBe(303);
		// The mail exists (the operator can read it on disk) …
		await lastLinkTo(DEMO.moderator.email, '/reset/confirm');
		// … but the visitor cannot.
		const outbox = await ctx.get('/dev/mail');
		expect(outbox.status()).toBe(404);
		expect(await outbox.text()).not.toContain('/reset/confirm?token=');
		await ctx.dispose();
	});

	test('the default `npm start` runs production: no outbox page, and a server without SMTP_URL says so at start and in health', async ({
		playwright
	}) => {
		const dataDir = newDataDir('start-default');
		const port = await freePort();
		const env = startEnv({
			PORT: String(port),
			DATABASE_URL: join(dataDir, 'bandwright.db'),
			DATA_DIR: dataDir,
			RATE_LIMIT_FACTOR: '3'
		});
		expect(env.NODE_ENV).toBe('production');
		const server = await startServer(env, dataDir);
		try {
			expect(server.output()).toMatch(/SMTP_URL is not set/);
			const health = await (await fetch(`${server.url}/api/v1/health`)).json();
			expect(health.ok).toBe(true);
			expect(health.mail).toBe('outbox');
			expect(health.warnings.join(' ')).toMatch(/SMTP_URL/);

			const ctx = await playwright.request.newContext({
				baseURL: server.url,
				extraHTTPHeaders: { origin: server.url, accept: 'text/html' }
			});
			const email = `${unique('victim')}@example.org`;
			const signUp = await ctx.post('/signup', {
				form: { email, displayName: 'Victim', password: 'a long victim passphrase' },
				maxRedirects: 0
			});
			expect(signUp.status()).toBe(303);
			expect((await ctx.post('/reset', { form: { email }, maxRedirects: 0 })).status()).toBe(303);
			// Both mails were written to the outbox on disk …
			await expect
				.poll(() => readdirSync(join(dataDir, 'outbox')).filter((f) => f.endsWith('.eml')).length)
				.toBe(2);
			// … and no visitor on this machine or elsewhere can list them.
			for (const headers of [{}, REMOTE]) {
				const outbox = await ctx.get('/dev/mail', { headers });
				expect(outbox.status()).toBe(404);
				expect(await outbox.text()).not.toContain('token=');
			}
			await ctx.dispose();
		} finally {
			await server.stop();
		}
	});
});

test('everything that depends on the session is sent with Cache-Control: private, no-store', async ({
	page
}) => {
	await signIn(page, DEMO.author);
	const { slug } = await importDesign(page.request, BASE);
	const paths = [
		'/account',
		'/designs/new',
		'/designs',
		`/designs/${slug}/r/1`,
		`/designs/${slug}/r/1/edit`,
		`/designs/${slug}/r/1/__data.json`,
		`/api/v1/designs/${slug}/revisions/1`,
		`/api/v1/designs/${slug}/revisions/1/dimensions`
	];
	for (const path of paths) {
		const res = await page.request.get(path);
		expect(res.status(), path).toBe(200);
		const cc = res.headers()['cache-control'] ?? '';
		expect(cc, path).toContain('private');
		expect(cc, path).toContain('no-store');
	}
	// The answer that sets the session cookie is not kept either.
	const signInRes = await page.request.post('/signin', {
		form: DEMO.author,
		headers: FORM,
		maxRedirects: 0
	});
	expect(signInRes.headers()['set-cookie']).toContain('bw_session=');
	expect(signInRes.headers()['cache-control'] ?? '').toContain('no-store');
});

test('no page asks the browser to evaluate strings: no CSP violation or console error', async ({
	page
}) => {
	const problems: string[] = [];
	page.on('console', (m) => {
		if (m.type() === 'error') problems.push(`console: ${m.text()}`);
	});
	page.on('pageerror', (e) => problems.push(`pageerror: ${e.message}`));
	await page.addInitScript(() => {
		document.addEventListener('securitypolicyviolation', (e) => {
			console.error(`CSP violation: ${e.violatedDirective} ${e.blockedURI}`);
		});
	});
	const visit = async (p: Page, path: string) => {
		await p.goto(path);
		await p.waitForLoadState('networkidle');
	};
	for (const path of ['/', '/designs', '/designs/biquad-2g4', '/signin', '/signup', '/reset'])
		await visit(page, path);
	await signIn(page, DEMO.author);
	const { slug } = await importDesign(page.request, BASE);
	for (const path of [
		'/designs/new',
		'/account',
		`/designs/${slug}/r/1/edit`,
		`/designs/${slug}/r/1/measurements`,
		`/designs/${slug}/r/1/photos`
	]) {
		await visit(page, path);
	}
	expect(problems).toEqual([]);

	// The validation library is told not to generate code in the browser (zod's jitless setting).
	const dir = join(process.env.BUILD_DIR || 'build', 'client', '_app', 'immutable');
	const files = readdirSync(dir, { recursive: true, encoding: 'utf8' }).filter((f) =>
		f.endsWith('.js')
	);
	expect(
		files.some((f) => /jitless:(?:!0|true|typeof window)/.test(readFileSync(join(dir, f), 'utf8')))
	).toBe(true);
});

test.describe('guessing limits', () => {
	test('confirming e-mail tokens is rate limited', async ({ playwright }) => {
		const ctx = await playwright.request.newContext({
			baseURL: BASE,
			userAgent: unique('verify-probe'),
			extraHTTPHeaders: FORM
		});
		let limited = false;
		const token = `${'a'.repeat(24)}.${'b'.repeat(24)}`;
		for (let i = 0; i < 60 && !limited; i++) {
			// As the page's form sends it: to the link's own address.
			limited = (await ctx.post(`/verify?token=${token}`, { form: { token } })).status() === 429;
		}
		expect(limited).toBe(true);
		await ctx.dispose();
	});

	test('wrong passwords for one account from many browsers slow that account down, but its owner still gets in', async ({
		playwright
	}) => {
		const email = `${unique('guessed')}@example.org`;
		const password = 'the right long passphrase';
		const browserCtx = (n: number) =>
			playwright.request.newContext({
				baseURL: BASE,
				userAgent: unique(`guesser-${n}`),
				extraHTTPHeaders: FORM
			});
		const first = await browserCtx(0);
		expect(
			(
				await first.post('/signup', {
					form: { email, displayName: 'Guessed', password },
					maxRedirects: 0
				})
			).status()
		).toBe(303);
		// Each guess from another browser, so no per-browser limit is ever reached.
		const attempt = async (n: number, pw: string) => {
			const ctx = await browserCtx(n);
			const started = Date.now();
			const res = await ctx.post('/signin', { form: { email, password: pw }, maxRedirects: 0 });
			const result = {
				status: res.status(),
				location: res.headers()['location'],
				ms: Date.now() - started
			};
			await ctx.dispose();
			return result;
		};
		for (let n = 1; n <= 5; n++) expect((await attempt(n, `wrong guess ${n}`)).status).toBe(400);
		const slowed = await attempt(6, 'wrong guess 6');
		expect(slowed.status).toBe(400);
		expect(slowed.ms).toBeGreaterThanOrEqual(900);
		// Not a lockout: the owner's right password still signs in.
		const owner = await attempt(7, password);
		expect(owner.status).toBe(303);
		expect(owner.location).toBe('/account');
		await first.dispose();
	});
});

import { expect, test } from '@playwright/test';
import { BASE, DEMO, mailsTo, unique } from './helpers';

test('sign-up: empty, too long, wrong type and weak passwords get field messages and write nothing', async ({
	page
}) => {
	await page.goto('/signup');
	await page.getByRole('button', { name: 'Create account' }).click();
	await expect(page.getByText('Enter your e-mail address.')).toBeVisible();
	await expect(page.getByText('Use at least 2 characters.')).toBeVisible();
	await expect(page.getByText('Enter a password.')).toBeVisible();

	const email = `${unique('bad')}@example.org`;
	await page.getByLabel('E-mail').fill('not-an-address');
	await page.getByLabel('Display name').fill('x'.repeat(61));
	await page.getByLabel('Password').fill('password123');
	await page.getByRole('button', { name: 'Create account' }).click();
	await expect(page.getByText('Enter a valid e-mail address')).toBeVisible();
	await expect(page.getByText('At most 60 characters.')).toBeVisible();
	// Entered values survive the round trip (except the password).
	await expect(page.getByLabel('E-mail')).toHaveValue('not-an-address');

	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Display name').fill('Weak Password');
	await page.getByLabel('Password').fill('password123');
	await page.getByRole('button', { name: 'Create account' }).click();
	await expect(page.getByText('most common passwords')).toBeVisible();
	expect(mailsTo(email)).toHaveLength(0);
});

test('sign-up with an address that has an account answers the same and makes no account', async ({
	page
}) => {
	const before = mailsTo(DEMO.author.email).length;
	await page.goto('/signup');
	await page.getByLabel('E-mail').fill(DEMO.author.email.toUpperCase());
	await page.getByLabel('Display name').fill('Impostor');
	await page.getByLabel('Password').fill('another long passphrase');
	await page.getByRole('button', { name: 'Create account' }).click();
	await expect(page.getByRole('heading', { name: 'Check your e-mail' })).toBeVisible();
	// Account mail is queued and sent just after the answer: wait for it to reach the outbox.
	await expect.poll(() => mailsTo(DEMO.author.email).length).toBe(before + 1);
	expect(mailsTo(DEMO.author.email).at(-1)).toContain('already has a Bandwright account');
});

test('forms without JavaScript still validate on the server', async ({ browser }) => {
	const ctx = await browser.newContext({ javaScriptEnabled: false });
	const page = await ctx.newPage();
	await page.goto('/signin');
	await page.getByLabel('E-mail').fill(DEMO.author.email);
	await page.getByLabel('Password').fill('wrong wrong wrong');
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page.getByText('do not match an account')).toBeVisible();
	await ctx.close();
});

test('bad, tampered and used tokens give a clear page, never a 500', async ({ page, request }) => {
	for (const token of [
		'',
		'abc',
		'a.b.c',
		'x'.repeat(500),
		'aaaaaaaaaaaaaaaaaaaaaaaa.bbbbbbbbbbbbbbbbbbbbbbbb'
	]) {
		const res = await request.get(`/verify?token=${encodeURIComponent(token)}`);
		expect(res.status(), token).toBeLessThan(500);
		const r2 = await request.get(`/reset/confirm?token=${encodeURIComponent(token)}`);
		expect(r2.status(), token).toBeLessThan(500);
	}
	await page.goto('/verify?token=aaaaaaaaaaaaaaaaaaaaaaaa.bbbbbbbbbbbbbbbbbbbbbbbb');
	await expect(page.getByText('This link is not valid')).toBeVisible();
	const post = await request.post('/verify', {
		form: { token: 'forged.token' },
		headers: { origin: BASE, accept: 'text/html' }
	});
	expect(post.status()).toBe(400);
});

test('a tampered session cookie counts as signed out', async ({ page, context }) => {
	await context.addCookies([
		{
			name: 'bw_session',
			value: 'aaaaaaaaaaaaaaaaaaaaaaaa.bbbbbbbbbbbbbbbbbbbbbbbb',
			domain: 'localhost',
			path: '/'
		}
	]);
	const res = await page.goto('/account');
	expect(res?.status()).toBe(200);
	await expect(page).toHaveURL(/\/signin/);
	await context.addCookies([
		{ name: 'bw_session', value: '<script>', domain: 'localhost', path: '/' }
	]);
	expect((await page.goto('/designs'))?.status()).toBeLessThan(500);
});

test('sign-in is rate limited per address and browser', async ({ playwright }) => {
	const ctx = await playwright.request.newContext({
		baseURL: BASE,
		userAgent: `rate-limit-probe-${Date.now()}`,
		extraHTTPHeaders: { origin: BASE, accept: 'text/html' }
	});
	let limited = false;
	for (let i = 0; i < 40 && !limited; i++) {
		// A new address each time: this is the per-browser limit, not the per-account slow-down.
		const res = await ctx.post('/signin', {
			form: { email: `nobody-${i}@example.org`, password: 'x' }
		});
		limited = res.status() === 429;
	}
	expect(limited).toBe(true);
	await ctx.dispose();
});

test('an unverified member can sign in but cannot author', async ({ page }) => {
	await page.goto('/signin');
	await page.getByLabel('E-mail').fill(DEMO.unverified.email);
	await page.getByLabel('Password').fill(DEMO.unverified.password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).toHaveURL(/\/account/);
	await expect(page.getByTestId('verified-state')).toHaveText('Not confirmed yet');
});

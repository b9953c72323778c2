import { expect, test } from '@playwright/test';
import { BASE, DEMO, lastLinkTo, mailsTo, signIn, unique } from './helpers';

test('sign up, confirm the address from the captured mail, sign in and out', async ({ page }) => {
	const email = `${unique('builder')}@example.org`;
	await page.goto('/signup');
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Display name').fill('Bench Builder');
	await page.getByLabel('Password').fill('a long bench passphrase');
	await page.getByRole('button', { name: 'Create account' }).click();
	await expect(page.getByRole('heading', { name: 'Check your e-mail' })).toBeVisible();

	const link = await lastLinkTo(email, '/verify');
	await page.goto(link);
	await page.getByRole('button', { name: 'Confirm address' }).click();
	await expect(page.getByText('Your e-mail address is confirmed')).toBeVisible();

	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill('a long bench passphrase');
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page.getByTestId('signed-in-as')).toHaveText('Bench Builder');
	const cookie = (await page.context().cookies()).find((c) => c.name === 'bw_session')!;
	expect(cookie.httpOnly).toBe(true);
	expect(cookie.sameSite).toBe('Lax');
	expect(cookie.value).toMatch(/^[a-z2-7]{24}\.[a-z2-7]{24}$/);

	// The link is single-use.
	await page.goto(link);
	await expect(page.getByText('already been used')).toBeVisible();

	await page.getByRole('button', { name: 'Sign out' }).click();
	await expect(page.getByRole('link', { name: 'Sign in' })).toBeVisible();
	await page.goto('/account');
	await expect(page).toHaveURL(/\/signin\?next=%2Faccount/);
});

test('a wrong password and an unknown address get the same message', async ({ page }) => {
	await page.goto('/signin');
	await page.getByLabel('E-mail').fill(DEMO.author.email);
	await page.getByLabel('Password').fill('not the password at all');
	await page.getByRole('button', { name: 'Sign in' }).click();
	const wrong = await page.getByTestId('form-message').textContent();
	expect(wrong).toContain('do not match an account');
	await expect(page.getByLabel('Password')).toHaveValue('');
	await expect(page.getByLabel('E-mail')).toHaveValue(DEMO.author.email);

	await page.getByLabel('E-mail').fill('nobody-here@example.org');
	await page.getByLabel('Password').fill('not the password at all');
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page.getByTestId('form-message')).toHaveText(wrong!);
});

test('password reset by mail ends every session of the account', async ({ page, browser }) => {
	const email = `${unique('resetter')}@example.org`;
	await page.goto('/signup');
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Display name').fill('Reset Tester');
	await page.getByLabel('Password').fill('first bench passphrase');
	await page.getByRole('button', { name: 'Create account' }).click();
	await page.goto(await lastLinkTo(email, '/verify'));
	await page.getByRole('button', { name: 'Confirm address' }).click();
	await signIn(page, { email, password: 'first bench passphrase' });

	const other = await browser.newContext();
	const otherPage = await other.newPage();
	await otherPage.goto('/reset');
	await otherPage.getByLabel('E-mail').fill(email);
	await otherPage.getByRole('button', { name: 'Send reset link' }).click();
	await expect(otherPage.getByText('If that address has an account')).toBeVisible();
	// An unknown address gets the very same page.
	await otherPage.goto('/reset');
	await otherPage.getByLabel('E-mail').fill('nobody-at-all@example.org');
	await otherPage.getByRole('button', { name: 'Send reset link' }).click();
	await expect(otherPage.getByText('If that address has an account')).toBeVisible();
	expect(mailsTo('nobody-at-all@example.org')).toHaveLength(0);

	await otherPage.goto(await lastLinkTo(email, '/reset/confirm'));
	await otherPage.getByLabel('New password').fill('short');
	await otherPage.getByRole('button', { name: 'Set password' }).click();
	await expect(otherPage.getByText('at least 8 characters')).toBeVisible();
	await otherPage.getByLabel('New password').fill('second bench passphrase');
	await otherPage.getByRole('button', { name: 'Set password' }).click();
	await expect(otherPage.getByText('Password changed')).toBeVisible();
	await other.close();

	// The first browser's session ended with the reset.
	await page.goto('/account');
	await expect(page).toHaveURL(/\/signin/);
	await signIn(page, { email, password: 'second bench passphrase' });
});

test('a moderator grants the reviewer role and the audit log records it', async ({ page }) => {
	await signIn(page, DEMO.moderator);
	await page.goto('/moderation');
	const row = page.locator(`[data-testid=user-row][data-email="${DEMO.member.email}"]`);
	await row.getByRole('combobox').selectOption('reviewer');
	await row.getByRole('button', { name: 'Save' }).click();
	await expect(page.getByTestId('role-message')).toContainText('member to reviewer');
	await page.goto('/moderation/audit');
	const entry = page.getByTestId('audit-row').filter({ hasText: DEMO.member.email }).first();
	await expect(entry).toContainText('role.set');
	await expect(entry).toContainText('"to":"reviewer"');
	// Put it back so other specs see the demo member as a member.
	await page.goto('/moderation');
	await row.getByRole('combobox').selectOption('member');
	await row.getByRole('button', { name: 'Save' }).click();
	await expect(page.getByTestId('role-message')).toContainText('reviewer to member');
});

test('members get 403 on moderator pages; anonymous visitors are sent to sign-in', async ({
	page,
	request
}) => {
	const anon = await request.get('/moderation', { maxRedirects: 0 });
	expect(anon.status()).toBe(303);
	expect(anon.headers()['location']).toBe('/signin?next=%2Fmoderation');

	await signIn(page, DEMO.author);
	for (const path of ['/moderation', '/moderation/audit']) {
		const res = await page.goto(path);
		expect(res?.status()).toBe(403);
	}
	// A forged role field changes nothing (mass assignment).
	const res = await page.request.post('/moderation?/setRole', {
		form: { userId: 'x', role: 'moderator' },
		headers: { origin: BASE, accept: 'text/html' }
	});
	expect(res.status()).toBe(403);
});

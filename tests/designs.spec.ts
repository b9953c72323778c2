import { expect, test } from '@playwright/test';
import { PDFDocument } from 'pdf-lib';
import { BASE, DEMO, signIn, unique } from './helpers';
import { XSS_VECTORS } from '../src/lib/testing/xss-corpus';

const form = { origin: BASE, accept: 'text/html' };

test('an author creates a design, adds rows with live values, saves and submits; search finds it', async ({
	page
}) => {
	const word = unique('tinplatexyz').replace(/-/g, '');
	await signIn(page, DEMO.author);
	await page.goto('/designs/new');
	await page.locator('input[name=title]').fill(`Test biquad ${word}`);
	await page.locator('select[name=family]').selectOption('biquad');
	await page.locator('select[name=polarization]').selectOption('linear');
	await page.locator('input[name=frequency]').fill('2.45 GHz');
	await page.getByRole('button', { name: 'Create draft r1' }).click();
	await expect(page.getByRole('heading', { name: 'Edit draft r1' })).toBeVisible();

	// The starter row computes live: λ/4 at 2.45 GHz = 30.59 mm [calc λ = c/f, c = 299 792 458 m/s].
	await expect(page.getByTestId('live-value').first()).toContainText('30.59 mm');
	await page.getByRole('button', { name: 'Add row' }).click();
	const row = page.getByTestId('dim-row').nth(1);
	await row.locator('input[name=r_key]').fill('spacing');
	await row.locator('input[name=r_label]').fill('Reflector spacing');
	await row.locator('input[name=r_formula]').fill('lambda / 8');
	// λ/8 at 2.45 GHz = 15.30 mm [calc]
	await expect(row.getByTestId('live-value')).toContainText('15.30 mm');
	await row.locator('input[name=r_formula]').fill('lambda / nowhere');
	await expect(row.getByTestId('live-value')).toContainText('nowhere');
	await row.locator('input[name=r_formula]').fill('lambda / 8');
	await page
		.getByLabel('Build notes (Markdown)')
		.fill(`Bend the wire. Mount it over a ${word} reflector.`);
	await page.getByRole('button', { name: 'Save draft' }).click();
	await expect(page.getByTestId('editor-message')).toHaveText('Draft saved.');
	await page.getByRole('button', { name: 'Save and submit for review' }).click();
	await expect(page.getByTestId('revision-state')).toContainText('Awaiting review');
	await expect(page.getByTestId('awaiting-review')).toBeVisible();

	await page.goto(`/designs?q=${word}`);
	await expect(page.getByTestId('design-item')).toHaveCount(1);
	await expect(page.getByTestId('snippet').locator('mark')).toHaveText(word);
	const api = await page.request.get(`/api/v1/designs?q=${word}&contains_hz=2450000000`);
	expect((await api.json()).total).toBe(1);
});

test('a reader rescales to 5.8 GHz without a reload, switches to inches, downloads the build sheet', async ({
	page
}) => {
	// The third view is a kept copy (page cache): it must hydrate under its own CSP nonce like a render.
	const nonces = new Set<string>();
	for (let i = 0; i < 3; i++) {
		const res = await page.goto('/designs/biquad-2g4');
		nonces.add(/'nonce-([^']+)'/.exec(res!.headers()['content-security-policy'])![1]);
	}
	expect(nonces.size).toBe(3);
	await expect(page.getByTestId('cautions')).toBeVisible();
	const marker = await page.evaluate(
		() => ((window as unknown as { marker: number }).marker = Math.random())
	);
	const input = page.getByLabel(/frequency/i).first();
	await input.fill('5.8 GHz');
	await expect(page).toHaveURL(/f=5800000000/);
	await expect(page.getByText(/λ = 51\.69 mm/).first()).toBeVisible(); // c / 5.8 GHz = 51.688 mm [calc]
	expect(await page.evaluate(() => (window as unknown as { marker: number }).marker)).toBe(marker);
	await page.locator('label', { hasText: 'fractional' }).click();
	await expect(page).toHaveURL(/units=in_frac/);
	await expect(page.locator('table').first()).toContainText('/64');

	const link = await page.getByTestId('build-sheet-link').getAttribute('href');
	const res = await page.request.get(link!);
	expect(res.status()).toBe(200);
	expect(res.headers()['content-type']).toBe('application/pdf');
	const pdf = await PDFDocument.load(await res.body());
	const [w, h] = [pdf.getPage(0).getWidth(), pdf.getPage(0).getHeight()];
	expect([w, h]).toEqual([595.28, 841.89]); // ISO 216 A4 = 210 × 297 mm in 1/72 in points
});

test('the server renders a shared ?f= view without JavaScript, and bad ?f= values fall back clearly', async ({
	browser
}) => {
	const ctx = await browser.newContext({ javaScriptEnabled: false });
	const page = await ctx.newPage();
	await page.goto('/designs/dipole-868?f=433.92M');
	await expect(page.getByText(/433\.92 MHz/).first()).toBeVisible();
	for (const bad of ['0', '-5', 'abc', '1e20']) {
		const res = await page.goto(`/designs/dipole-868?f=${encodeURIComponent(bad)}`);
		expect(res?.status(), bad).toBe(200);
		await expect(page.getByTestId('frequency-message')).toContainText('ignored');
	}
	await ctx.close();
});

test('stored notes are sanitized for a corpus of XSS vectors; others cannot edit a draft; submitted is frozen', async ({
	page,
	browser
}) => {
	await signIn(page, DEMO.author);
	await page.goto('/designs/new');
	await page.locator('input[name=title]').fill(`XSS notes ${unique('x')}`);
	await page.locator('select[name=family]').selectOption('dipole');
	await page.locator('select[name=polarization]').selectOption('linear');
	await page.locator('input[name=frequency]').fill('868 MHz');
	await page.getByRole('button', { name: 'Create draft r1' }).click();
	await expect(page.getByRole('heading', { name: 'Edit draft r1' })).toBeVisible();
	const editUrl = page.url();
	expect(XSS_VECTORS.length).toBeGreaterThanOrEqual(50);
	await page.getByLabel('Build notes (Markdown)').fill(XSS_VECTORS.join('\n\n'));
	// The preview comes from the server's one render path: what the author sees is what readers get.
	await page.getByRole('tab', { name: 'Preview' }).click();
	await expect(page.getByTestId('notes-preview').locator('p').first()).toBeVisible();
	// Svelte's hydration markers are comments; the rendered markup is the rest.
	const markup = (html: string) => html.replace(/<!--[\s\S]*?-->/g, '').trim();
	const previewed = markup(await page.getByTestId('notes-preview').innerHTML());
	await page.getByRole('tab', { name: 'Write' }).click();
	const dialogs: string[] = [];
	page.on('dialog', (d) => {
		dialogs.push(d.message());
		void d.dismiss();
	});
	await page.getByRole('button', { name: 'Save draft' }).click();
	await expect(page.getByTestId('editor-message')).toHaveText('Draft saved.');
	const view = editUrl.replace(/\/edit$/, '');
	await page.goto(view);
	const notes = page.getByTestId('notes');
	expect(markup(await notes.innerHTML())).toBe(previewed);
	expect(
		await notes.locator('script, iframe, object, embed, form, input, style, base, meta').count()
	).toBe(0);
	const handlers = await notes.evaluate((el) =>
		[...el.querySelectorAll('*')].flatMap((n) =>
			[...n.attributes]
				.filter((a) => /^on/i.test(a.name) || /^\s*(javascript|vbscript|data):/i.test(a.value))
				.map((a) => a.name)
		)
	);
	expect(handlers).toEqual([]);
	expect(dialogs).toEqual([]);

	// Someone else: the draft is hidden (404) and its edit action is refused.
	const other = await browser.newContext();
	const otherPage = await other.newPage();
	await signIn(otherPage, DEMO.member);
	expect((await otherPage.goto(editUrl))?.status()).toBe(404);
	const post = await otherPage.request.post(`${editUrl}?/save`, {
		form: { notes: 'mine now' },
		headers: form
	});
	expect(post.status()).toBe(404);
	await other.close();

	// After submitting, every write route answers 409 and the content stays.
	await page.goto(editUrl);
	await page.getByRole('button', { name: 'Save and submit for review' }).click();
	await expect(page.getByTestId('revision-state')).toContainText('Awaiting review');
	expect((await page.goto(editUrl))?.status()).toBe(409);
	const save = await page.request.post(`${editUrl}?/save`, {
		form: { notes: 'changed later' },
		headers: form
	});
	expect(save.status()).toBe(409);
	const submit = await page.request.post(`${view}?/submit`, { form: {}, headers: form });
	expect(submit.status()).toBe(409);
	const json = await (
		await page.request.get(`/api/v1${new URL(view).pathname.replace('/r/', '/revisions/')}`)
	).json();
	expect(json.revision.notes).toContain(XSS_VECTORS[0]);
	expect(json.revision.state).toBe('submitted');
});

test('bad authoring input: taken slug, long formula, 201 rows, huge notes, unverified author', async ({
	page,
	browser
}) => {
	await signIn(page, DEMO.author);
	await page.goto('/designs/new');
	await page.locator('input[name=title]').fill('Slug collision');
	await page.locator('input[name=slug]').fill('biquad-2g4');
	await page.locator('select[name=family]').selectOption('biquad');
	await page.locator('select[name=polarization]').selectOption('linear');
	await page.locator('input[name=frequency]').fill('2.45 GHz');
	await page.getByRole('button', { name: 'Create draft r1' }).click();
	await expect(page.getByText(/is taken; try "biquad-2g4-2"/)).toBeVisible();

	await page.locator('input[name=slug]').fill(unique('limits'));
	await page.getByRole('button', { name: 'Create draft r1' }).click();
	await expect(page.getByRole('heading', { name: 'Edit draft r1' })).toBeVisible();
	const editUrl = page.url();
	const base = {
		design_frequency: '2.45 GHz',
		claim_centre: '2.45 GHz',
		claim_lo: '2.4 GHz',
		claim_hi: '2.5 GHz',
		claim_vswr: '2',
		notes: '',
		change_note: ''
	};
	const rows = (n: number, formula = 'lambda / 4') => {
		const f = new URLSearchParams(base);
		for (let i = 0; i < n; i++) {
			for (const [k, v] of [
				['r_key', `r${i}`],
				['r_label', `Row ${i}`],
				['r_formula', formula],
				['r_kind', 'resonant'],
				['r_catalogue', ''],
				['r_tolerance', ''],
				['r_ratio_lo', ''],
				['r_ratio_hi', '']
			])
				f.append(k, v);
		}
		return f.toString();
	};
	const post = (body: string) =>
		page.request.post(`${editUrl}?/save`, {
			data: body,
			headers: { ...form, 'content-type': 'application/x-www-form-urlencoded' }
		});
	const tooMany = await post(rows(201));
	expect(tooMany.status()).toBe(400);
	expect(await tooMany.text()).toContain('at most 200 rows');
	const longFormula = await post(rows(1, `lambda / 4 + ${'0 * lambda + '.repeat(40)}0 mm`));
	expect(longFormula.status()).toBe(400);
	expect(await longFormula.text()).toContain('500');
	const huge = await post(
		new URLSearchParams({
			...base,
			notes: 'x'.repeat(201 * 1024),
			r_key: 'a',
			r_label: 'A',
			r_formula: 'lambda/4',
			r_kind: 'resonant'
		}).toString()
	);
	expect(huge.status()).toBe(400);
	expect(await huge.text()).toContain('200 kB');
	const api = await (
		await page.request.get(
			`/api/v1${new URL(editUrl).pathname.replace('/r/', '/revisions/').replace(/\/edit$/, '')}`
		)
	).json();
	expect(api.revision.rows).toHaveLength(1);

	const ctx = await browser.newContext();
	const p2 = await ctx.newPage();
	await p2.goto('/signin');
	await p2.getByLabel('E-mail').fill(DEMO.unverified.email);
	await p2.getByLabel('Password').fill(DEMO.unverified.password);
	await p2.getByRole('button', { name: 'Sign in' }).click();
	await expect(p2).toHaveURL(/\/account/);
	expect((await p2.goto('/designs/new'))?.status()).toBe(403);
	await ctx.close();
});

test('an error page shows the id handleError gave, so a reader can quote it', async ({ page }) => {
	const res = await page.goto('/no-such-page-anywhere');
	expect(res?.status()).toBe(404);
	await expect(page.getByTestId('error-page')).toContainText('Not found');
	await expect(page.getByTestId('error-id')).toHaveText(/^[0-9a-f-]{36}$/);
});

test('the formula guide and the editor help list the family functions from their one declaration', async ({
	page
}) => {
	await page.goto('/guide/formulas');
	for (const call of [
		'patch_width(f, er)',
		'te11_cutoff(d, er?)',
		'guide_wavelength(f, d, er?)',
		'mismatch_loss(v)'
	]) {
		await expect(page.getByRole('cell', { name: call, exact: true })).toBeVisible();
	}
	// Pozar §3.4 with PTFE (εr 2.08), a = 0.5 cm: TE11 cutoff 12.18 GHz [calc].
	await expect(page.getByRole('row', { name: /te11_cutoff\(d, er\?\)/ })).toContainText(
		'12.18 GHz'
	);
	await signIn(page, DEMO.author);
	await page.goto('/designs/new');
	await page.locator('input[name=title]').fill(`Help ${unique('h')}`);
	await page.locator('select[name=family]').selectOption('dipole');
	await page.locator('select[name=polarization]').selectOption('linear');
	await page.locator('input[name=frequency]').fill('868 MHz');
	await page.getByRole('button', { name: 'Create draft r1' }).click();
	await page.getByText('Built-in functions for formulas').click();
	await expect(page.getByTestId('function-help')).toContainText('guide_wavelength(f, d, er?)');
});

import { expect, test, type Page } from '@playwright/test';
import { readFileSync } from 'node:fs';
import sharp from 'sharp';
import { BASE, DEMO, signIn, unique } from './helpers';
import {
	exifHasGps,
	jpegWithGps,
	pngHeaderOnly,
	resonanceRows,
	solidPng,
	touchstone
} from '../src/lib/testing/upload-fixtures';

const fixture = (name: string) => readFileSync(`src/lib/testing/sweeps/${name}`);
// Resonance at 2450 MHz, Q 8, R = Z0: VSWR ≤ 2 from about 2345 to 2559 MHz ([calc], see measurements.test.ts)
const PASSING = touchstone(resonanceRows(2450, 8, 50, 2200, 2700, 401));
// Resonance at 2300 MHz: the VSWR ≤ 2 band ends near 2403 MHz, short of a 2.5 GHz band edge
const MISSING = touchstone(resonanceRows(2300, 8, 50, 2100, 2600, 401));
// A 3-port file: the first data line holds the frequency and three pairs (Touchstone 1.1)
const THREE_PORT = '# GHz S MA R 50\n1 0.5 0 0.1 0 0.1 0\n 0.1 0 0.5 0 0.1 0\n 0.1 0 0.1 0 0.5 0\n';
// The passing sweep swept wide (|S11| 0.9926 at 1 and 6 GHz [calc]) and read 0.8 % high out there,
// as a calibration can near total reflection
const NOISY = touchstone(
	resonanceRows(2450, 8, 50, 1000, 6000, 501).map(([f, m, a]) => [f, m > 0.99 ? m * 1.008 : m, a])
);
// The same series RLC as Z-parameters normalized to R (Touchstone 1.1): z = 1 + jQ(f/f0 − f0/f)
const Z_FILE = ['! invented Z-parameter export', '# MHz Z RI R 50']
	.concat(
		Array.from({ length: 401 }, (_, i) => {
			const f = 2200 + (500 * i) / 400;
			return `${f} 1 ${8 * (f / 2450 - 2450 / f)}`;
		})
	)
	.join('\n');

async function analyze(
	request: import('@playwright/test').APIRequestContext,
	body: Buffer | string,
	query = ''
) {
	return request.post(`/api/v1/sweeps/analyze${query}`, {
		data: typeof body === 'string' ? Buffer.from(body) : body,
		headers: { 'content-type': 'application/octet-stream' }
	});
}

test.describe('POST /api/v1/sweeps/analyze', () => {
	test('analyzes a sweep without signing in and stores nothing', async ({ request }) => {
		const res = await analyze(
			request,
			PASSING,
			'?design_hz=2.45e9&band_lo_hz=2.4e9&band_hi_hz=2.5e9&vswr_max=2'
		);
		expect(res.status()).toBe(200);
		const body = await res.json();
		expect(body.points).toBe(401);
		expect(body.claim.pass).toBe(true);
		expect(body.series.f_hz).toHaveLength(401);
		expect(body.min_vswr).toBeLessThan(1.1);
		const csv = await analyze(
			request,
			fixture('semicolon-decimal-comma.csv'),
			'?design_hz=2450.5e6'
		);
		expect(csv.status()).toBe(200);
		// RL 13.979 dB ↔ VSWR 1.5 (Pozar 4th ed. §2.3; CHECKS.md)
		expect((await csv.json()).vswr_at_design).toBeCloseTo(1.5, 3);
	});

	test('answers 400 with the field for a bad query, 4xx with a located message for bad files', async ({
		request
	}) => {
		const q = await analyze(request, PASSING, '?band_lo_hz=2.5e9&band_hi_hz=2.4e9');
		expect(q.status()).toBe(400);
		expect((await q.json()).error).toMatchObject({ field: 'band_hi_hz' });
		const z = await analyze(request, PASSING, '?z0=abc');
		expect((await z.json()).error.field).toBe('z0');

		const three = await analyze(request, THREE_PORT);
		expect(three.status()).toBe(422);
		expect((await three.json()).error).toMatchObject({
			line: 2,
			message: expect.stringMatching(/only 1-port and 2-port files are read/i)
		});
		const s22 = await analyze(request, PASSING, '?parameter=s22');
		expect(s22.status()).toBe(422);
		expect((await s22.json()).error).toMatchObject({ field: 'parameter' });
		expect((await (await analyze(request, PASSING, '?parameter=s21')).json()).error).toMatchObject({
			field: 'parameter'
		});
		const after = await analyze(request, '! x\n2.0 0.5 10\n# MHz S MA R 50\n2.1 0.5 10\n');
		expect((await after.json()).error).toMatchObject({ line: 3, column: 1 });
		const empty = await analyze(request, '');
		expect(empty.status()).toBe(422);
		expect((await empty.json()).error.message).toMatch(/empty/i);

		const jpeg = await analyze(request, await jpegWithGps(64, 48));
		expect(jpeg.status()).toBe(415);
		expect((await jpeg.json()).error.message).toMatch(/this is an image/i);
		const big = await analyze(request, Buffer.alloc(11 * 1024 * 1024, 0x31));
		expect(big.status()).toBe(413);
		expect((await big.json()).error.message).toMatch(/at most 10 MB/);
	});
});

/** Priya's own fresh design (a copy of a demo design file, imported), r1 submitted; returns its path. */
async function newSubmittedDesign(page: Page): Promise<string> {
	const slug = unique('sweep-biquad');
	const file = await page.request.get('/designs/biquad-2g4/r/2/design.md');
	const text = (await file.text())
		.replace(/^slug: .*$/m, `slug: ${slug}`)
		.replace(/^title: .*$/m, `title: Sweep test biquad ${slug}`);
	await page.goto('/designs/new');
	await page
		.getByLabel('Design file')
		.setInputFiles({ name: `${slug}.md`, mimeType: 'text/markdown', buffer: Buffer.from(text) });
	await page.getByRole('button', { name: 'Import as a new draft' }).click();
	await expect(page).toHaveURL(new RegExp(`/designs/${slug}/r/1/edit`));
	const base = `/designs/${slug}/r/1`;
	await page.goto(base);
	await page.getByRole('button', { name: 'Submit for review' }).click();
	await expect(page).toHaveURL(/submitted=1/);
	return base;
}

async function uploadSweep(page: Page, base: string, name: string, content: string | Buffer) {
	await page.goto(`${base}/measurements`);
	await page
		.getByLabel('Sweep file')
		.setInputFiles({ name, mimeType: 'application/octet-stream', buffer: Buffer.from(content) });
	await page.getByLabel('Date measured').fill('2025-10-01');
	await page.getByLabel('Calibration and reference plane').fill('SOL at the feed connector');
}

test('the author uploads a sweep, sees the charts and the claim check, and downloads the file', async ({
	page
}) => {
	await signIn(page, DEMO.author);
	const base = await newSubmittedDesign(page);

	// bad files through the form: a clear message, nothing added
	await uploadSweep(page, base, 'photo.s1p', await jpegWithGps(64, 48));
	await page.getByRole('button', { name: 'Upload measurement' }).click();
	await expect(page.getByTestId('upload-error')).toContainText('This is an image');
	await uploadSweep(page, base, 'three.s3p', THREE_PORT);
	await page.getByRole('button', { name: 'Upload measurement' }).click();
	await expect(page.getByTestId('upload-error')).toContainText(
		/only 1-port and 2-port files are read.*\(line 2, column 1\)/i
	);

	// 11 MB passes adapter-node's BODY_SIZE_LIMIT (16M here) and is refused by our 10 MB limit
	await uploadSweep(page, base, 'big.s1p', Buffer.alloc(11 * 1024 * 1024, 0x31));
	await page.getByRole('button', { name: 'Upload measurement' }).click();
	await expect(page.getByTestId('upload-error')).toContainText(
		'The file is 11.0 MB; a sweep may be at most 10 MB.'
	);
	await uploadSweep(page, base, 'my-biquad.s1p', PASSING);
	await page.getByRole('button', { name: 'Upload measurement' }).click();
	await expect(page).toHaveURL(new RegExp(`${base}\\?added=`));
	const items = page.getByTestId('measurement');
	await expect(items).toHaveCount(1);
	await expect(items.first().getByTestId('claim-check')).toHaveText('Meets the claim');
	await expect(page.getByTestId('measurement-summary')).toContainText(
		"1 author's measurement (1 meets the claim)"
	);
	const charts = page.getByTestId('sweep-charts');
	await expect(charts.locator('svg[role=img]')).toHaveCount(2);
	await expect(charts.locator('path.trace')).toHaveCount(2);
	await expect(charts.getByText('claimed band').first()).toBeVisible();
	await expect(page.getByTestId('smith').locator('polyline.trace')).toHaveCount(1);

	const href = await items.first().getByTestId('sweep-download').getAttribute('href');
	const file = await page.request.get(href!);
	expect(file.status()).toBe(200);
	expect(file.headers()['content-type']).toBe('text/plain; charset=utf-8');
	expect(file.headers()['content-disposition']).toMatch(/^attachment; filename="my-biquad\.s1p"/);
	expect(file.headers()['x-content-type-options']).toBe('nosniff');
	expect(await file.text()).toBe(PASSING);
});

test.describe('files from real instruments', () => {
	test('the analyze API returns warnings, and reads S22 of a 2-port file when asked', async ({
		request
	}) => {
		const noisy = await (await analyze(request, NOISY)).json();
		expect(noisy.warnings).toEqual([
			{
				code: 'above_unity',
				message: expect.stringMatching(/points read \|S11\| above 1.*calibration noise/),
				count: expect.any(Number),
				max_excess: expect.any(Number),
				frequency_hz: expect.any(Number)
			}
		]);
		expect(noisy.min_vswr).toBeLessThan(1.01);
		// the fixture's line 3: S11 0.5∠−10°, S22 0.4∠−30° (MA); VSWR = (1 + |Γ|)/(1 − |Γ|) [calc]
		const two = await (await analyze(request, fixture('two-port.s2p'))).json();
		expect(two.min_vswr).toBeCloseTo(3, 9);
		expect(two.warnings[0]).toMatchObject({ code: 'two_port_parameter', count: null });
		const port2 = await (await analyze(request, fixture('two-port.s2p'), '?parameter=S22')).json();
		expect(port2.min_vswr).toBeCloseTo(1.4 / 0.6, 9);
		expect(port2.warnings[0].message).toMatch(/^2-port file: S22/);
	});

	test('a builder uploads a sweep with calibration noise and a Z file, and sees what was odd', async ({
		page
	}) => {
		await signIn(page, DEMO.author);
		const base = await newSubmittedDesign(page);
		await uploadSweep(page, base, 'wide-sweep.s1p', NOISY);
		await page.getByRole('button', { name: 'Upload measurement' }).click();
		await expect(page).toHaveURL(new RegExp(`${base}\\?added=`));
		await expect(page.getByTestId('sweep-added')).toContainText('read the note on the file below');
		const id = new URL(page.url()).searchParams.get('added');
		const stored = await (await page.request.get(`/api/v1/measurements/${id}`)).json();
		expect(stored.warnings).toEqual([
			expect.objectContaining({ code: 'above_unity', count: expect.any(Number) })
		]);
		const first = page.getByTestId('measurement').first();
		await expect(first.getByTestId('claim-check')).toHaveText('Meets the claim');
		await expect(first.getByTestId('sweep-warnings')).toContainText(
			/points read \|S11\| above 1, the largest 1\.00\d+ at .*calibration noise.*VSWR there is off the scale/
		);

		await uploadSweep(page, base, 'analyser-z.s1p', Z_FILE);
		await page.getByRole('button', { name: 'Upload measurement' }).click();
		await expect(page).toHaveURL(new RegExp(`${base}\\?added=`));
		const second = page.getByTestId('measurement').nth(1);
		await expect(second.getByTestId('sweep-warnings')).toHaveText(
			"Z-parameter file: Z11, normalized to R = 50 Ω as Touchstone 1.x writes it, was converted to S11 for the file's reference impedance of 50 Ω: Γ = (Z − R)/(Z + R)."
		);
		await expect(second.getByTestId('claim-check')).toHaveText('Meets the claim');
		await expect(page.getByTestId('sweep-charts').locator('path.trace')).toHaveCount(4);
	});
});

test('another member files a build report that misses, on a demo design', async ({ page }) => {
	await signIn(page, DEMO.member);
	const base = '/designs/biquad-2g4/r/2';
	await page.goto(base);
	const before = await page.locator('[data-testid=measurement][data-kind=build_report]').count();
	await page.getByRole('link', { name: 'File a build report' }).click();
	await expect(page.getByRole('heading', { name: 'File a build report on r2' })).toBeVisible();
	await uploadSweep(page, base, 'jules-build.s1p', MISSING);
	await page.getByLabel('Built for (target frequency)').fill('2.45 GHz');
	await page.getByLabel('Deviations from the design').fill('Reflector cut 4 mm short.');
	await page.getByLabel('Materials').fill('1.5 mm copper wire, PCB reflector.');
	await page.getByRole('button', { name: 'File build report' }).click();
	await expect(page).toHaveURL(/\?added=/);
	const reports = page.locator('[data-testid=measurement][data-kind=build_report]');
	await expect(reports).toHaveCount(before + 1);
	const mine = reports.last();
	await expect(mine.getByTestId('claim-check')).toHaveText('Misses the claim');
	await expect(mine.getByTestId('claim-detail')).toContainText(
		/falls short by \d+(\.\d)? MHz at the top/
	);
	await expect(mine).toContainText('Reflector cut 4 mm short.');
	await expect(page.getByTestId('sweep-charts').locator('path.trace').first()).toBeVisible();
});

test('a photo upload shows its thumbnail, and the served image has no EXIF GPS', async ({
	page,
	request
}) => {
	await signIn(page, DEMO.author);
	const base = await newSubmittedDesign(page);
	const original = await jpegWithGps(2000, 1500);
	expect(exifHasGps((await sharp(original).metadata()).exif)).toBe(true);

	const pick = async (name: string, buffer: Buffer) => {
		await page.goto(`${base}/photos`);
		await page.getByLabel('Image file').setInputFiles({ name, mimeType: 'image/jpeg', buffer });
		await page.getByLabel('Caption').fill(`caption ${name}`);
		await page.getByRole('button', { name: 'Upload image' }).click();
	};
	await pick('huge.png', pngHeaderOnly(20_000, 20_000));
	await expect(page.getByTestId('upload-error')).toContainText(
		'20000 × 20000 pixels (400 megapixels)'
	);
	await pick('cut.jpg', original.subarray(0, Math.floor(original.length * 0.6)));
	await expect(page.getByTestId('upload-error')).toContainText('damaged or truncated');

	await pick('feed.jpg', original);
	await expect(page).toHaveURL(/\?added=.*#photos$/);
	const thumb = page.getByTestId('gallery').getByRole('img', { name: 'caption feed.jpg' });
	await expect(thumb).toBeVisible();
	await expect.poll(() => thumb.evaluate((img: HTMLImageElement) => img.naturalWidth)).toBe(320);

	const displayHref = await thumb.locator('xpath=..').getAttribute('href');
	const display = await request.get(`${BASE}${displayHref}`);
	expect(display.headers()['content-type']).toBe('image/webp');
	expect(display.headers()['x-content-type-options']).toBe('nosniff');
	expect(display.headers()['content-disposition']).toMatch(/^inline; filename="image-/);
	const meta = await sharp(await display.body()).metadata();
	expect(meta.format).toBe('webp');
	expect(meta.exif).toBeUndefined();
	expect(exifHasGps(meta.exif)).toBe(false);
	expect(Math.max(meta.width!, meta.height!)).toBe(1600);

	// a PNG named .jpg is taken as the PNG it is
	await pick('really-a-png.jpg', await solidPng(400, 300));
	await expect(page.getByTestId('gallery').getByRole('img')).toHaveCount(2);
});

test('upload pages and actions need a verified member', async ({ page, request }) => {
	const anon = await request.get('/designs/biquad-2g4/r/2/measurements', { maxRedirects: 0 });
	expect(anon.status()).toBe(303);
	expect(anon.headers()['location']).toMatch(/^\/signin\?next=/);
	const post = await request.post('/designs/biquad-2g4/r/2/photos', {
		headers: { origin: BASE, accept: 'text/html' },
		multipart: {
			caption: 'x',
			file: { name: 'a.png', mimeType: 'image/png', buffer: await solidPng(8, 8) }
		},
		maxRedirects: 0
	});
	expect(post.status()).toBe(303);
	expect(post.headers()['location']).toMatch(/^\/signin/);
	await signIn(page, DEMO.unverified);
	const res = await page.goto('/designs/biquad-2g4/r/2/measurements');
	expect(res?.status()).toBe(403);
});

import { expect, test, type Browser, type Page } from '@playwright/test';
import { BASE, DEMO, mailsTo, signIn, unique } from './helpers';
import { XSS_VECTORS } from '../src/lib/testing/xss-corpus';

const FORM = { origin: BASE, accept: 'text/html' };

/** The Subject header, unfolded (long headers are folded over several lines). */
const subject = (raw: string) =>
	raw
		.replace(/\r?\n(?=[ \t])/g, '')
		.match(/^Subject: (.*)$/m)?.[1]
		?.trim() ?? '';

/** A design file with a quarter-wave row at 5.8 GHz and three lines of notes. */
function designFile(slug: string, title: string) {
	return `---
bandwright: 1
title: ${title}
slug: ${slug}
family: patch
polarization: linear
summary: Review spec design (test data).
design_frequency_hz: 5800000000
parameters: []
rows:
  - key: side
    label: Quarter-wave side
    formula: lambda / 4
    kind: resonant
    tolerance_mm: 0.2
  - key: wire
    label: Wire
    formula: 1.6 mm
    kind: material
claim:
  centre_hz: 5800000000
  band_lo_hz: 5725000000
  band_hi_hz: 5875000000
  vswr_max: 2
change_note: First try.
---
Cut the side to a quarter wave.
Bend the wire at both ends.
Solder the feed at the centre.
`;
}

async function as(browser: Browser, who: { email: string; password: string }): Promise<Page> {
	const page = await (await browser.newContext()).newPage();
	await signIn(page, who);
	return page;
}

/** Imports a design as the author; with submit, r1 is submitted for review. */
async function importDesign(page: Page, submit = true) {
	const slug = unique('rvw');
	const title = `Review spec patch ${slug}`;
	await page.goto('/designs/new');
	// Attach the file after hydration, or the hydrated form starts without it.
	await page.waitForLoadState('networkidle');
	await page.getByLabel('Design file').setInputFiles({
		name: `${slug}.md`,
		mimeType: 'text/markdown',
		buffer: Buffer.from(designFile(slug, title))
	});
	await page.getByRole('button', { name: /import/i }).click();
	await expect(page).toHaveURL(new RegExp(`/designs/${slug}/r/1/edit`));
	if (submit) {
		await page.getByRole('button', { name: 'Save and submit for review' }).click();
		await expect(page).toHaveURL(new RegExp(`/designs/${slug}/r/1\\?submitted=1`));
	}
	return { slug, title };
}

test('review round trip: comment, return, reply, r2, compare at 5.8 GHz, approve, mails', async ({
	browser
}) => {
	const author = await as(browser, DEMO.author);
	const { slug, title } = await importDesign(author);

	// A reader without an account opens it three times (kept from the second view, served from the third).
	const reader = await (await browser.newContext()).newPage();
	for (let i = 0; i < 3; i++) {
		await reader.goto(`/designs/${slug}`);
		await expect(reader.getByTestId('revision-state')).toHaveText(/r1/);
	}

	// The reviewer finds it in the queue (filtered by family) and opens it.
	const reviewer = await as(browser, DEMO.reviewer);
	await reviewer.goto('/review?family=patch');
	const row = reviewer.locator(`[data-testid=queue-row][data-slug="${slug}"]`);
	await expect(row).toContainText('r1');
	await expect(row).toContainText('Priya');
	await row.getByRole('link', { name: title }).click();
	await expect(reviewer).toHaveURL(new RegExp(`/review/${slug}/1$`));

	// Comment on a row, using the row's Comment button (it picks the anchor).
	await reviewer.getByRole('button', { name: 'Comment on row Quarter-wave side' }).click();
	await expect(reviewer.getByLabel('A dimension row')).toBeChecked();
	await reviewer
		.getByLabel('Comment (Markdown)')
		.fill('Is the **side** measured to the wire centre?');
	await reviewer.getByRole('button', { name: 'Add comment' }).click();
	const rowThread = reviewer
		.getByTestId('thread')
		.filter({ hasText: 'measured to the wire centre' });
	await expect(rowThread.getByTestId('thread-anchor')).toHaveText('Row side');
	await expect(rowThread.locator('strong')).toHaveText('side');

	// Comment on a line range of the notes.
	await reviewer.getByLabel('Lines of the notes').check();
	await reviewer.getByLabel('First line').fill('2');
	await reviewer.getByLabel('Last line').fill('3');
	await reviewer.getByLabel('Comment (Markdown)').fill('Which solder and flux?');
	await reviewer.getByRole('button', { name: 'Add comment' }).click();
	await expect(
		reviewer.getByTestId('thread').filter({ hasText: 'Which solder' }).getByTestId('thread-anchor')
	).toHaveText('Lines 2–3');

	// Return it for revision.
	await reviewer.getByRole('radio', { name: /^Revise/ }).check();
	await reviewer.getByLabel('Summary').fill('Please say where the side is measured.');
	await reviewer.getByRole('button', { name: 'Submit review' }).click();
	await expect(reviewer.getByTestId('review-state')).toHaveText('Returned for revision');

	// The author follows the mailed link, replies, resolves, and starts r2.
	let link = '';
	await expect
		.poll(() => {
			const mail = mailsTo(DEMO.author.email)
				.filter((m) => m.includes(title) && m.includes('#comment-'))
				.at(-1);
			link = mail?.match(/https?:\/\/\S+#comment-\S+/)?.[0] ?? '';
			return link;
		})
		.toContain(`/review/${slug}/1#comment-`);
	await author.goto(link.replace(/^https?:\/\/[^/]+/, ''));
	const thread = author.getByTestId('thread').filter({ hasText: 'measured to the wire centre' });
	await thread.getByText('Reply', { exact: true }).click();
	await thread.getByLabel(/Reply to/).fill('Yes, centre to centre; r2 says so.');
	await thread.getByRole('button', { name: 'Send reply' }).click();
	await expect(thread.getByTestId('reply')).toContainText('centre to centre');
	await thread.getByRole('button', { name: 'Mark resolved' }).click();
	await expect(thread.getByTestId('resolved')).toBeVisible();

	await author.goto(`/designs/${slug}/r/1`);
	await author.getByRole('button', { name: 'Start a new revision' }).click();
	await expect(author).toHaveURL(new RegExp(`/designs/${slug}/r/2/edit`));
	await author.locator('input[name=r_formula]').first().fill('lambda / 4 * 0.95');
	await author.locator('input[name=change_note]').fill('Side shortened by 5 %.');
	await author.getByRole('button', { name: 'Save and submit for review' }).click();
	await expect(author).toHaveURL(new RegExp(`/designs/${slug}/r/2\\?submitted=1`));

	// The reviewer compares r1 and r2 at 5.8 GHz.
	await reviewer.goto(`/designs/${slug}/compare?from=1&to=2&f=5.8%20GHz`);
	const side = reviewer.locator('[data-testid=diff-row][data-key=side]');
	await expect(side).toHaveAttribute('data-change', 'formula');
	// [calc] (0.95 − 1) × 100 = −5 % at any frequency; λ/4 at 5.8 GHz = 12.92 mm, ×0.95 = 12.28 mm
	await expect(side.getByTestId('delta-pct')).toHaveText('−5.00 %');
	await expect(side).toContainText('12.92 mm → 12.28 mm');
	await expect(side).toContainText('beyond its ±0.2 mm tolerance');
	await expect(reviewer.locator('[data-testid=diff-row][data-key=wire]')).toHaveAttribute(
		'data-change',
		'unchanged'
	);
	await expect(reviewer.getByTestId('sweep-shift')).toContainText('No sweeps');

	// Changing the frequency refetches from the API without a full reload.
	await reviewer.evaluate(() => ((window as unknown as { marker: number }).marker = 42));
	const apiCall = reviewer.waitForResponse((r) => r.url().includes(`/api/v1/designs/${slug}/diff`));
	await reviewer.getByRole('textbox', { name: 'Values at' }).fill('2.45 GHz');
	await reviewer.getByRole('button', { name: 'Compare' }).click();
	expect((await apiCall).status()).toBe(200);
	// [calc] λ/4 at 2.45 GHz = 299792458 / 2.45e9 / 4 = 30.59 mm
	await expect(side).toContainText('30.59 mm');
	await expect(reviewer).toHaveURL(/f=2\.45/);
	expect(await reviewer.evaluate(() => (window as unknown as { marker?: number }).marker)).toBe(42);

	// Approve r2: it becomes the design's shown revision.
	await reviewer.goto(`/review/${slug}/2`);
	await reviewer.getByRole('radio', { name: /^Approve/ }).check();
	await reviewer.getByLabel('Summary').fill('Built and measured; approve.');
	await reviewer.getByRole('button', { name: 'Submit review' }).click();
	await expect(reviewer.getByTestId('review-state')).toHaveText('Approved');
	await reviewer.goto(`/designs/${slug}`);
	await expect(reviewer.getByTestId('revision-state')).toHaveText(/r2 · Approved/);
	await expect(reviewer.getByTestId('reviews-panel')).toContainText('Built and measured; approve.');
	// The reader without an account sees the approval at once: the write moved the page stamp on.
	await reader.goto(`/designs/${slug}`);
	await expect(reader.getByTestId('revision-state')).toHaveText(/r2 · Approved/);
	await expect(reader.getByTestId('reviews-panel')).toContainText('Built and measured; approve.');

	// The author got a mail for each comment and each review.
	await expect
		.poll(() =>
			mailsTo(DEMO.author.email)
				.filter((m) => m.includes(title))
				.map(subject)
		)
		.toEqual(
			expect.arrayContaining([
				`Comment on ${title} r1`,
				`Review of ${title} r1: returned for revision`,
				`Review of ${title} r2: approved`
			])
		);
	await expect
		.poll(
			() => mailsTo(DEMO.author.email).filter((m) => subject(m) === `Comment on ${title} r1`).length
		)
		.toBe(2);
	// The reviewer's thread got the author's reply by mail.
	await expect
		.poll(
			() => mailsTo(DEMO.reviewer.email).filter((m) => subject(m) === `Reply on ${title} r1`).length
		)
		.toBe(1);
});

test('bad input: 403, 404, 409, 422 with messages, same-revision view, sanitized XSS', async ({
	browser
}) => {
	const author = await as(browser, DEMO.author);
	const reviewer = await as(browser, DEMO.reviewer);
	const member = await as(browser, DEMO.member);
	const { slug } = await importDesign(author);
	const post = (p: Page, path: string, form: Record<string, string>) =>
		p.request.post(path, { form, headers: FORM });

	// Members do not review; authors are not offered their own revision and cannot review it.
	expect((await member.goto('/review'))?.status()).toBe(403);
	expect(
		(
			await post(author, `/review/${slug}/1?/review`, { verdict: 'approve', summary: 'mine' })
		).status()
	).toBe(403);

	// Anchors to a missing row, huge comments: 422 with a message, nothing stored.
	const noRow = await post(reviewer, `/review/${slug}/1?/comment`, {
		body: 'x',
		anchor: 'row',
		row_key: 'no_such_row'
	});
	expect(noRow.status()).toBe(422);
	expect(await noRow.text()).toContain('no dimension row with the key');
	const huge = await post(reviewer, `/review/${slug}/1?/comment`, { body: 'a'.repeat(20_001) });
	expect(huge.status()).toBe(422);
	expect(await huge.text()).toContain('the limit is 20,000');
	const badLines = await post(reviewer, `/review/${slug}/1?/comment`, {
		body: 'x',
		anchor: 'lines',
		line_start: '2',
		line_end: '9'
	});
	expect(badLines.status()).toBe(422);

	// XSS through the stored view: every corpus vector is a comment, none runs or keeps a handler.
	let dialogs = 0;
	reviewer.on('dialog', (d) => {
		dialogs++;
		void d.dismiss();
	});
	for (const v of XSS_VECTORS) {
		const res = await post(reviewer, `/review/${slug}/1?/comment`, { body: v });
		expect(res.status(), v).toBeLessThan(400);
	}
	await reviewer.goto(`/review/${slug}/1`);
	await expect(reviewer.getByTestId('thread')).toHaveCount(XSS_VECTORS.length);
	const unsafe = await reviewer.evaluate(() => {
		const root = document.querySelectorAll('[data-testid=thread] .prose-bw');
		let bad = 0;
		root.forEach((el) => {
			el.querySelectorAll('*').forEach((n) => {
				if (
					['SCRIPT', 'IFRAME', 'OBJECT', 'EMBED', 'SVG', 'FORM', 'INPUT', 'STYLE'].includes(
						n.tagName.toUpperCase()
					)
				)
					bad++;
				for (const a of Array.from(n.attributes)) {
					if (a.name.startsWith('on')) bad++;
					if (
						(a.name === 'href' || a.name === 'src') &&
						/^\s*(javascript|vbscript|data):/i.test(a.value)
					)
						bad++;
				}
			});
		});
		return bad;
	});
	expect(unsafe).toBe(0);
	expect(dialogs).toBe(0);

	// Diff API: a revision number this design does not have is 404; junk is 400; from == to is "same".
	expect((await reviewer.request.get(`/api/v1/designs/${slug}/diff?from=1&to=7`)).status()).toBe(
		404
	);
	expect((await reviewer.request.get(`/api/v1/designs/${slug}/diff?from=one&to=1`)).status()).toBe(
		400
	);
	expect(
		(await reviewer.request.get(`/api/v1/designs/${slug}/diff?from=1&to=1&f=loud`)).status()
	).toBe(400);
	const same = await reviewer.request.get(`/api/v1/designs/${slug}/diff?from=1&to=1&f=5.8%20GHz`);
	const body = await same.json();
	expect(body.same).toBe(true);
	expect(body.rows.map((r: { change: string }) => r.change)).toEqual(['unchanged', 'unchanged']);
	expect(body.rows[0]).toHaveProperty('value_from_mm');
	expect(body.measurements.message).toBe('no sweeps');
	await reviewer.goto(`/designs/${slug}/compare?from=1&to=1`);
	await expect(reviewer.getByTestId('same-revision')).toBeVisible();
	expect((await reviewer.goto(`/designs/${slug}/compare?from=1&to=5`))?.status()).toBe(404);

	// Withdrawn: review is 409, comment is 409.
	await author.goto(`/designs/${slug}/r/1`);
	await author.getByRole('button', { name: 'Withdraw' }).click();
	await expect(author.getByTestId('revision-state')).toContainText('Withdrawn');
	const late = await post(reviewer, `/review/${slug}/1?/review`, {
		verdict: 'approve',
		summary: 'late'
	});
	expect(late.status()).toBe(409);
	expect(await late.text()).toContain('withdrawn');
	expect((await post(reviewer, `/review/${slug}/1?/comment`, { body: 'late' })).status()).toBe(409);

	// Someone else's draft: hidden from the page (404), refused to a post (403), hidden from the diff.
	await author.getByRole('button', { name: 'Start a new revision' }).click();
	await expect(author).toHaveURL(new RegExp(`/designs/${slug}/r/2/edit`));
	expect((await reviewer.goto(`/review/${slug}/2`))?.status()).toBe(404);
	expect((await post(reviewer, `/review/${slug}/2?/comment`, { body: 'peek' })).status()).toBe(403);
	expect((await reviewer.request.get(`/api/v1/designs/${slug}/diff?from=1&to=2`)).status()).toBe(
		404
	);
	expect((await author.request.get(`/api/v1/designs/${slug}/diff?from=1&to=2`)).status()).toBe(200);
});

test('a moderator confirms a rejection; the revision is returned and the reject stays on record', async ({
	browser
}) => {
	const author = await as(browser, DEMO.author);
	const { slug } = await importDesign(author);
	const reviewer = await as(browser, DEMO.reviewer2);
	await reviewer.goto(`/review/${slug}/1`);
	await reviewer.getByRole('radio', { name: /^Reject/ }).check();
	await reviewer.getByLabel('Summary').fill('The claimed band is not reachable with this feed.');
	await reviewer.getByRole('button', { name: 'Submit review' }).click();
	await expect(reviewer.getByTestId('reject-pending')).toBeVisible();
	await expect(reviewer.getByTestId('review-state')).toHaveText('Awaiting review');

	const moderator = await as(browser, DEMO.moderator);
	await moderator.goto(`/review/${slug}/1`);
	await moderator.getByRole('button', { name: /Confirm rejection by Ines/ }).click();
	await expect(moderator.getByTestId('review-state')).toHaveText('Returned for revision');
	await expect(moderator.getByTestId('review')).toContainText('Rejection confirmed by Wren');
	await moderator.goto('/moderation/audit');
	await expect(
		moderator.getByTestId('audit-row').filter({ hasText: 'review.reject_confirm' }).first()
	).toBeVisible();
});

test('notification settings: a reviewer following patches gets a mail when one is submitted', async ({
	browser
}) => {
	const reviewer = await as(browser, DEMO.reviewer2);
	await reviewer.goto('/account');
	const form = reviewer.getByTestId('notification-form');
	await form.getByLabel(/submitted for review in a family I follow/).check();
	await form.getByLabel('Patch', { exact: true }).check();
	await form.getByRole('button', { name: 'Save notification settings' }).click();
	await expect(reviewer.getByTestId('notify-message')).toHaveText('Notification settings saved.');
	await reviewer.reload();
	await expect(form.getByLabel('Patch', { exact: true })).toBeChecked();

	const author = await as(browser, DEMO.author);
	const { slug, title } = await importDesign(author);
	await expect
		.poll(
			() =>
				mailsTo(DEMO.reviewer2.email).filter((m) => subject(m) === `Review wanted: ${title} r1`)
					.length
		)
		.toBe(1);
	expect(mailsTo(DEMO.reviewer2.email).find((m) => m.includes(title))).toContain(
		`/review/${slug}/1`
	);

	// Put it back for other specs.
	await form.getByLabel(/submitted for review in a family I follow/).uncheck();
	await form.getByLabel('Patch', { exact: true }).uncheck();
	await form.getByRole('button', { name: 'Save notification settings' }).click();
	await expect(reviewer.getByTestId('notify-message')).toBeVisible();
});

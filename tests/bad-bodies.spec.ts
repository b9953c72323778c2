import { expect, test, type APIRequestContext, type Browser } from '@playwright/test';
import { readdirSync, readFileSync } from 'node:fs';
import http from 'node:http';
import { join, relative, sep } from 'node:path';
import { BASE, DEMO, signIn } from './helpers';
import { designFile, importDesign, postDesignFile } from './http-helpers';

const FORM = { origin: BASE, accept: 'text/html' };

/** Every named form action in src/routes, read from the files as they are now. */
function formActions(): { route: string; action: string }[] {
	const found: { route: string; action: string }[] = [];
	const walk = (dir: string) => {
		for (const entry of readdirSync(dir, { withFileTypes: true })) {
			const path = join(dir, entry.name);
			if (entry.isDirectory()) walk(path);
			else if (entry.name === '+page.server.ts') {
				const source = readFileSync(path, 'utf8');
				const block = source.split(/export const actions[^=]*=[^{]*\{/)[1];
				if (!block) continue;
				const route =
					'/' +
					relative('src/routes', dir)
						.split(sep)
						.filter((s) => s && !/^\(.*\)$/.test(s))
						.join('/');
				for (const [, action] of block.matchAll(/^\t(\w+): /gm)) found.push({ route, action });
			}
		}
	};
	walk('src/routes');
	return found;
}

/** Actions that never read a body, so a broken one cannot matter (they must still never give a 5xx). */
const BODYLESS = new Set([
	'/signout default',
	'/designs/[slug]/r/[n] submit',
	'/designs/[slug]/r/[n] withdraw',
	'/designs/[slug] newRevision',
	'/account resend'
]);

const BROKEN = {
	'content-type': 'multipart/form-data; boundary=----bandwright',
	body: '------bandwright\r\nContent-Disposition: form-data; name="body"\r\n\r\nthe body stops here without its closing boundary'
};

async function signedIn(browser: Browser, who: { email: string; password: string }) {
	const page = await (await browser.newContext()).newPage();
	await signIn(page, who);
	return page.request;
}

test('a broken multipart body gets a 400 with a message from every form action, never a 500', async ({
	browser,
	playwright
}) => {
	const actions = formActions();
	expect(actions.length).toBeGreaterThanOrEqual(20);
	const anonymous = await playwright.request.newContext({ baseURL: BASE });
	const author = await signedIn(browser, DEMO.author);
	const reviewer = await signedIn(browser, DEMO.reviewer);
	const moderator = await signedIn(browser, DEMO.moderator);
	const draft = await importDesign(author, BASE);
	const submitted = await importDesign(author, BASE, { submit: true });

	const who = (route: string): [APIRequestContext, Record<string, string>] => {
		if (/^\/(signin|signup|verify|reset|signout)/.test(route)) return [anonymous, {}];
		if (route.startsWith('/moderation')) return [moderator, {}];
		if (route.startsWith('/review/')) return [reviewer, { slug: submitted.slug, n: '1' }];
		if (route === '/designs/[slug]/r/[n]') return [author, { slug: submitted.slug, n: '1' }];
		return [author, { slug: draft.slug, n: '1' }];
	};
	const results: string[] = [];
	for (const { route, action } of actions) {
		const [request, params] = who(route);
		const path = route.replace(/\[(\w+)\]/g, (_, name: string) => params[name] ?? 'x');
		const url = action === 'default' ? path : `${path}?/${action}`;
		const res = await request.post(url, {
			headers: { ...FORM, 'content-type': BROKEN['content-type'] },
			data: BROKEN.body,
			maxRedirects: 0
		});
		const text = await res.text();
		const expected = BODYLESS.has(`${route} ${action}`)
			? res.status() < 500
			: res.status() === 400 && text.includes('could not be read');
		results.push(`${expected ? 'ok ' : 'BAD'} ${res.status()} ${url}`);
	}
	expect(
		results.filter((r) => r.startsWith('BAD')),
		results.join('\n')
	).toEqual([]);
	await anonymous.dispose();
});

/** One request through `agent`; the answer, and whether it went over a connection used before. */
function send(
	agent: http.Agent,
	body: string
): Promise<{ status: number; reused: boolean; text: string }> {
	return new Promise((resolve, reject) => {
		const req = http.request(`${BASE}/api/v1/evaluate`, {
			method: 'POST',
			agent,
			headers: {
				'content-type': 'application/json',
				'content-length': Buffer.byteLength(body),
				'user-agent': 'keep-alive-probe'
			}
		});
		req.setTimeout(10_000, () => req.destroy(new Error('no answer within 10 s')));
		req.on('response', (res) => {
			let text = '';
			res.on('data', (d) => (text += d));
			res.on('end', () => resolve({ status: res.statusCode!, reused: req.reusedSocket, text }));
		});
		req.on('error', reject);
		req.end(body);
	});
}

test('after a 413 from the evaluate API, the next request on the same connection works', async () => {
	const agent = new http.Agent({ keepAlive: true, maxSockets: 1 });
	const tooLarge = JSON.stringify({
		frequency_hz: 1e9,
		parameters: [],
		rows: [],
		pad: 'x'.repeat(1024 * 1024)
	});
	const first = await send(agent, tooLarge);
	expect(first.status).toBe(413);
	const ok = JSON.stringify({
		frequency_hz: 5.8e9,
		parameters: [],
		rows: [{ key: 'q', formula: 'lambda / 4', kind: 'resonant' }]
	});
	const second = await send(agent, ok);
	expect(second.status).toBe(200);
	expect(second.reused).toBe(true);
	// λ/4 at 5.8 GHz = 12.9221 mm [calc λ = c/f, c = 299 792 458 m/s exact, SI Brochure 9th ed.]
	expect(JSON.parse(second.text).rows[0].value_mm).toBeCloseTo(12.9221, 4);
	agent.destroy();
});

test('an image of 16 MB or more gets the same clear 413 naming the limit as one of 15.9 MB', async ({
	page
}) => {
	await signIn(page, DEMO.author);
	const { slug } = await importDesign(page.request, BASE);
	const MB = 1024 * 1024;
	for (const size of [15.9 * MB, 16 * MB, 17 * MB]) {
		const buffer = Buffer.alloc(Math.round(size), 0);
		buffer.set([0xff, 0xd8, 0xff, 0xe0]); // a JPEG's first bytes; the size check comes first anyway
		const res = await page.request.post(`/designs/${slug}/r/1/photos`, {
			headers: FORM,
			multipart: {
				kind: 'photo',
				caption: 'big',
				file: { name: 'big.jpg', mimeType: 'image/jpeg', buffer }
			},
			maxRedirects: 0
		});
		expect(res.status(), `${size / MB} MB`).toBe(413);
		expect(await res.text(), `${size / MB} MB`).toContain('an image may be at most 15 MB');
	}
});

test('import refuses a formula the editor would refuse, naming the row, and bytes that are not UTF-8, naming the offset', async ({
	page
}) => {
	await signIn(page, DEMO.author);
	const badRow = `  - key: side
    label: Quarter-wave side
    formula: lambda / 4
    kind: resonant
  - key: gap
    label: Feed gap
    formula: side * nowhere
    kind: structural`;
	const formula = await postDesignFile(
		page.request,
		BASE,
		designFile('import-bad-formula', badRow)
	);
	expect(formula.status()).toBe(422);
	const formulaText = await formula.text();
	expect(formulaText).toContain('rows[1]');
	expect(formulaText).toContain('gap');
	expect(formulaText).toContain('nowhere');

	const text = Buffer.from(designFile('import-bad-bytes', undefined, 'Caf\u00e9 notes.\n'));
	const at = text.indexOf(Buffer.from('\u00e9'));
	const latin1 = Buffer.concat([text.subarray(0, at), Buffer.from([0xe9]), text.subarray(at + 2)]);
	const bytes = await postDesignFile(page.request, BASE, latin1);
	expect(bytes.status()).toBe(422);
	expect(await bytes.text()).toContain(`byte ${at}`);
	// Neither import made a design.
	expect(
		(await page.request.get('/designs/import-bad-formula/r/1', { maxRedirects: 0 })).status()
	).toBe(404);
	expect(
		(await page.request.get('/designs/import-bad-bytes/r/1', { maxRedirects: 0 })).status()
	).toBe(404);
});

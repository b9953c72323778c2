import { expect, test } from '@playwright/test';
import Database from 'better-sqlite3';
import { mkdirSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join, relative, sep } from 'node:path';
import sharp from 'sharp';
import { signIn, unique } from './helpers';
import { importDesign } from './http-helpers';
import { newDataDir, freePort, startServer, type ServerProcess } from './server-process';

/** Every file under dir, as paths relative to it with "/" separators. */
function filesUnder(dir: string): string[] {
	try {
		return readdirSync(dir, { recursive: true, withFileTypes: true })
			.filter((e) => e.isFile())
			.map((e) => relative(dir, join(e.parentPath, e.name)).split(sep).join('/'));
	} catch {
		return [];
	}
}

test('after kills during uploads, a restart leaves no temporary files and no blob without its row', async ({
	browser,
	playwright
}) => {
	test.setTimeout(120_000);
	const dataDir = newDataDir('crash');
	const port = await freePort();
	const url = `http://localhost:${port}`;
	const env = {
		PORT: String(port),
		ORIGIN: url,
		DATABASE_URL: join(dataDir, 'bandwright.db'),
		DATA_DIR: dataDir,
		RATE_LIMIT_FACTOR: '1000',
		BODY_SIZE_LIMIT: '16M'
	};
	let server: ServerProcess = await startServer(env, dataDir);
	try {
		// A verified member with a draft to upload photos to.
		const email = `${unique('crash')}@example.org`;
		const who = { email, password: 'a long crash-test passphrase' };
		const anon = await playwright.request.newContext({
			baseURL: url,
			extraHTTPHeaders: { origin: url, accept: 'text/html' }
		});
		expect(
			(
				await anon.post('/signup', {
					form: { ...who, displayName: 'Crash Tester' },
					maxRedirects: 0
				})
			).status()
		).toBe(303);
		let token = '';
		await expect
			.poll(() => {
				const outbox = join(dataDir, 'outbox');
				const mail = filesUnder(outbox).map((f) =>
					readFileSync(join(outbox, f), 'utf8')
						.replace(/=\r?\n/g, '')
						.replace(/=3D/g, '=')
				);
				token = /verify\?token=([a-z2-7.]+)/.exec(mail.join('\n'))?.[1] ?? '';
				return token;
			})
			.toBeTruthy();
		expect((await anon.post('/verify', { form: { token }, maxRedirects: 0 })).status()).toBe(303);
		await anon.dispose();
		const page = await (await browser.newContext({ baseURL: url })).newPage();
		await signIn(page, who);
		const { slug } = await importDesign(page.request, url);

		// Noise does not compress, so each upload keeps sharp and the disk busy for a while.
		const photo = await sharp(
			Buffer.from(Array.from({ length: 1600 * 1200 * 3 }, () => Math.floor(Math.random() * 256))),
			{
				raw: { width: 1600, height: 1200, channels: 3 }
			}
		)
			.png()
			.toBuffer();
		const upload = () =>
			page.request
				.post(`/designs/${slug}/r/1/photos`, {
					headers: { origin: url, accept: 'text/html' },
					multipart: {
						kind: 'photo',
						caption: 'crash',
						keep_original: 'on',
						file: { name: 'p.png', mimeType: 'image/png', buffer: photo }
					},
					maxRedirects: 0,
					timeout: 20_000
				})
				.then((r) => r.status())
				.catch(() => 'cut');
		for (const after of [400, 700, 1000]) {
			const pending = Array.from({ length: 6 }, upload);
			await new Promise((r) => setTimeout(r, after));
			await server.stop('SIGKILL');
			await Promise.all(pending);
			server = await startServer(env, dataDir);
		}

		// What a kill can leave at the worst moment, placed by hand so the check never depends on luck.
		const blobs = join(dataDir, 'blobs');
		mkdirSync(join(blobs, 'images', '2026', '01'), { recursive: true });
		const orphanKey = `images/2026/01/${'a'.repeat(32)}`;
		writeFileSync(join(blobs, ...orphanKey.split('/')), 'bytes whose row was never written');
		writeFileSync(
			join(blobs, 'images', '2026', '01', `${'b'.repeat(32)}.0123456789ab.tmp`),
			'half a file'
		);
		await server.stop('SIGKILL');
		server = await startServer(env, dataDir);

		const files = filesUnder(blobs);
		expect(files.filter((f) => f.endsWith('.tmp'))).toEqual([]);
		const db = new Database(env.DATABASE_URL, { readonly: true });
		const referenced = new Set(
			[
				...db
					.prepare(
						'SELECT display_key AS k FROM attachments UNION ALL SELECT thumb_key FROM attachments UNION ALL SELECT original_key FROM attachments'
					)
					.all(),
				...db.prepare('SELECT file_key AS k FROM measurements').all()
			]
				.map((r) => (r as { k: string | null }).k)
				.filter((k): k is string => !!k)
		);
		db.close();
		expect(files.filter((f) => !referenced.has(f))).toEqual([]);
		// Every stored row still has its files: nothing acknowledged was swept away.
		expect([...referenced].filter((k) => !files.includes(k))).toEqual([]);
		expect(server.output()).toMatch(/removed .*orphan/i);
		await page.context().close();
	} finally {
		await server.stop();
	}
});

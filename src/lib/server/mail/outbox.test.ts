import { mkdtemp, readdir, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import {
	InvalidOutboxIdError,
	listOutbox,
	newOutboxId,
	OUTBOX_ID,
	parseEml,
	readOutboxMessage,
	writeOutboxMessage
} from './outbox';

let dir: string;
beforeEach(async () => {
	dir = await mkdtemp(path.join(tmpdir(), 'bw-outbox-'));
});
afterEach(async () => {
	await rm(dir, { recursive: true, force: true });
});

const eml = (subject: string, body: string) =>
	new TextEncoder().encode(
		`From: a@bandwright.test\r\nTo: b@example.org\r\nSubject: ${subject}\r\n` +
			`Date: Tue, 01 Dec 2026 10:00:00 +0000\r\nContent-Type: text/plain; charset=utf-8\r\n\r\n${body}`
	);

describe('outbox ids', () => {
	it('are basic ISO 8601 UTC time plus 16 hex digits', () => {
		const id = newOutboxId(new Date('2026-12-01T10:20:30.456Z'));
		expect(id).toMatch(/^20261201T102030\.456Z-[0-9a-f]{16}$/);
		expect(id).toMatch(OUTBOX_ID);
	});

	it('differ between calls in the same millisecond', () => {
		const now = new Date();
		expect(newOutboxId(now)).not.toBe(newOutboxId(now));
	});
});

describe('listOutbox', () => {
	it('returns [] when the directory does not exist', async () => {
		await expect(listOutbox(path.join(dir, 'missing'), { limit: 5 })).resolves.toEqual([]);
	});

	it('lists newest first, honours the limit and ignores foreign and temporary files', async () => {
		const ids: string[] = [];
		for (const s of ['first', 'second', 'third']) {
			ids.push((await writeOutboxMessage(dir, eml(s, 'body'))).id);
			await new Promise((r) => setTimeout(r, 3)); // distinct millisecond in the id
		}
		await writeFile(path.join(dir, 'notes.eml'), 'Subject: foreign\n\nx');
		await writeFile(path.join(dir, `.${newOutboxId()}.tmp`), 'Subject: partial\n\nx');
		const two = await listOutbox(dir, { limit: 2 });
		expect(two.map((m) => m.subject)).toEqual(['third', 'second']);
		expect(two.map((m) => m.id)).toEqual([ids[2], ids[1]]);
		const all = await listOutbox(dir);
		expect(all.map((m) => m.subject)).toEqual(['third', 'second', 'first']);
		expect(all[0].date).toBe('2026-12-01T10:00:00.000Z');
	});

	it('leaves no temporary file behind after a write', async () => {
		const { id } = await writeOutboxMessage(dir, eml('s', 'b'));
		expect(await readdir(dir)).toEqual([`${id}.eml`]);
	});
});

describe('readOutboxMessage', () => {
	it('reads one message by id and returns null for an unknown id', async () => {
		const { id } = await writeOutboxMessage(dir, eml('Hello', 'See https://bandwright.test/a.'));
		const msg = await readOutboxMessage(dir, id);
		expect(msg).toMatchObject({ id, subject: 'Hello', to: 'b@example.org' });
		expect(msg?.links).toEqual(['https://bandwright.test/a']);
		await expect(readOutboxMessage(dir, newOutboxId())).resolves.toBeNull();
	});

	it.each([
		'../../etc/passwd',
		'..',
		'',
		'20261201T102030.456Z-0123456789abcdef/../x',
		'20261201T102030.456Z-0123456789abcdef.eml',
		'20261201T102030.456Z-0123456789ABCDEF',
		'20261201T102030.456Z-0123456789abcdef\n',
		'%2e%2e%2fpasswd'
	])('rejects id %j before touching the file system', async (id) => {
		await expect(readOutboxMessage(dir, id)).rejects.toThrow(InvalidOutboxIdError);
	});
});

describe('parseEml (mailparser)', () => {
	it('decodes RFC 2047 encoded words in headers (RFC 2047 §8 examples)', async () => {
		const subject = async (h: string) =>
			(await parseEml(`Subject: ${h}\r\nContent-Type: text/plain\r\n\r\nx`)).subject;
		// RFC 2047 §8: "=?ISO-8859-1?Q?Andr=E9?= Pirard" displays as "André Pirard".
		expect(await subject('=?ISO-8859-1?Q?Andr=E9?= Pirard')).toBe('André Pirard');
		// RFC 2047 §8: "(=?ISO-8859-1?Q?a?= =?ISO-8859-1?Q?b?=)" displays as "(ab)".
		expect(await subject('(=?ISO-8859-1?Q?a?= =?ISO-8859-1?Q?b?=)')).toBe('(ab)');
		// RFC 2047 §8: "(=?ISO-8859-1?Q?a_b?=)" displays as "(a b)".
		expect(await subject('(=?ISO-8859-1?Q?a_b?=)')).toBe('(a b)');
		// [calc] base64 of the UTF-8 bytes of "Größe" is R3LDtsOfZQ==
		expect(await subject('=?UTF-8?B?R3LDtsOfZQ==?=')).toBe('Größe');
	});

	it('decodes quoted-printable soft line breaks and =XX bytes (RFC 2045 §6.7)', async () => {
		const raw =
			'Content-Type: text/plain; charset=utf-8\r\nContent-Transfer-Encoding: quoted-printable\r\n\r\n' +
			'https://x.test/?a=3D1&b=\r\n=3D2 caf=C3=A9\r\nend';
		const m = await parseEml(raw);
		expect(m.text).toBe('https://x.test/?a=1&b=2 café\nend');
		expect(m.links).toEqual(['https://x.test/?a=1&b=2']);
	});

	it('reads the text part of a nested multipart message and skips attachments', async () => {
		const raw = [
			'Subject: nested',
			'Content-Type: multipart/mixed; boundary="outer"',
			'',
			'preamble',
			'--outer',
			'Content-Type: multipart/alternative; boundary=inner',
			'',
			'--inner',
			'Content-Type: text/plain; charset=utf-8',
			'Content-Transfer-Encoding: base64',
			'',
			// [calc] base64 of "Sweep at https://bandwright.test/s/1"
			Buffer.from('Sweep at https://bandwright.test/s/1').toString('base64'),
			'--inner',
			'Content-Type: text/html',
			'',
			'<p><a href="https://bandwright.test/s/1?x=1&amp;y=2">sweep</a></p>',
			'--inner--',
			'--outer',
			'Content-Type: text/plain',
			'Content-Disposition: attachment; filename="a.txt"',
			'',
			'https://attachment.test/never',
			'--outer--',
			''
		].join('\r\n');
		const parsed = await parseEml(raw);
		expect(parsed.subject).toBe('nested');
		expect(parsed.text).toBe('Sweep at https://bandwright.test/s/1');
		expect(parsed.html).toBe('<p><a href="https://bandwright.test/s/1?x=1&amp;y=2">sweep</a></p>');
		expect(parsed.links).toEqual([
			'https://bandwright.test/s/1',
			'https://bandwright.test/s/1?x=1&y=2'
		]);
	});

	it('unfolds folded headers (RFC 5322 §2.2.3)', async () => {
		const parsed = await parseEml(
			'Subject: a long\r\n  folded subject\r\nTo: x@y.test\r\n\r\nbody'
		);
		expect(parsed.subject).toBe('a long folded subject');
		expect(parsed.text).toBe('body');
	});

	it('uses the HTML part without tags as text when there is no text part', async () => {
		const raw =
			'Subject: h\nContent-Type: text/html\n\n<p>Open <b>https://a.test/x</b> &amp; go</p>';
		const { id } = await writeOutboxMessage(dir, new TextEncoder().encode(raw));
		const msg = await readOutboxMessage(dir, id);
		expect(msg?.text).toBe('Open https://a.test/x & go');
		expect(msg?.links).toEqual(['https://a.test/x']);
	});
});

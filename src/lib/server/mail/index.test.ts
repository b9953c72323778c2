import { mkdtemp, readdir, readFile, rm } from 'node:fs/promises';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { SMTPServer, type SMTPServerSession } from 'smtp-server';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createMailer, MailInputError, type MailLogger, type MailMessage } from './index';
import { listOutbox, OUTBOX_ID, parseEml } from './outbox';

const FROM = 'noreply@bandwright.test';
// Demo data: invented address and link.
const LINK =
	'https://bandwright.test/verify?token=0123456789abcdefghijklmnopqrstuvwxyzABCDEFGH&next=/designs';

function recordingLogger() {
	const lines: { level: string; message: string; meta?: Record<string, unknown> }[] = [];
	const logger: MailLogger = {
		info: (message, meta) => lines.push({ level: 'info', message, meta }),
		warn: (message, meta) => lines.push({ level: 'warn', message, meta }),
		error: (message, meta) => lines.push({ level: 'error', message, meta })
	};
	return { lines, logger };
}

let dir: string;
beforeEach(async () => {
	dir = await mkdtemp(path.join(tmpdir(), 'bw-mail-'));
});
afterEach(async () => {
	await rm(dir, { recursive: true, force: true });
});

describe('outbox mailer', () => {
	it('writes the message as one .eml file that listOutbox reads back with its links', async () => {
		const { logger } = recordingLogger();
		const mailer = createMailer({ from: FROM, outboxDir: dir, logger });
		expect(mailer.kind).toBe('outbox');
		const { id } = await mailer.send({
			to: 'ana@example.org',
			subject: 'Confirm your e-mail — Bandwright',
			text: `Hello Ana,\n\nopen ${LINK} to confirm.\n`,
			html: `<p>Open <a href="${LINK.replace('&', '&amp;')}">this link</a>.</p>`
		});
		expect(id).toMatch(OUTBOX_ID);
		expect(await readdir(dir)).toEqual([`${id}.eml`]);

		const raw = await readFile(path.join(dir, `${id}.eml`), 'utf8');
		// The long line forces quoted-printable, so the listing must decode it to find the link.
		expect(raw).toContain('Content-Transfer-Encoding: quoted-printable');
		expect(raw).not.toContain(LINK);

		const [msg, ...rest] = await listOutbox(dir, { limit: 10 });
		expect(rest).toEqual([]);
		expect(msg).toMatchObject({
			id,
			file: path.join(dir, `${id}.eml`),
			from: FROM,
			to: 'ana@example.org',
			subject: 'Confirm your e-mail — Bandwright',
			text: `Hello Ana,\n\nopen ${LINK} to confirm.\n`,
			links: [LINK]
		});
		expect(Math.abs(Date.parse(msg.date) - Date.now())).toBeLessThan(60_000);
	});

	it('rejects CR/LF in the subject (header injection) and writes nothing', async () => {
		const mailer = createMailer({ from: FROM, outboxDir: dir });
		const msg = { to: 'ana@example.org', subject: 'Hi\r\nBcc: victim@example.org', text: 'x' };
		await expect(mailer.send(msg)).rejects.toThrow(MailInputError);
		await expect(mailer.send(msg)).rejects.toMatchObject({
			field: 'subject',
			message: 'Mail field "subject" must not contain line breaks (CR or LF)'
		});
		await expect(readdir(dir)).resolves.toEqual([]);
	});

	it.each([
		['ana@example.org\nBcc: victim@example.org', 'must not contain line breaks (CR or LF)'],
		['ana@example.org\rX: y', 'must not contain line breaks (CR or LF)'],
		['ana@example.org, victim@example.org', 'must be one plain e-mail address'],
		['Ana <ana@example.org>', 'must be one plain e-mail address'],
		['not-an-address', 'must be one plain e-mail address']
	])('rejects recipient %j', async (to, problem) => {
		const mailer = createMailer({ from: FROM, outboxDir: dir });
		await expect(mailer.send({ to, subject: 's', text: 't' })).rejects.toMatchObject({
			name: 'MailInputError',
			field: 'to',
			message: `Mail field "to" ${problem}`
		});
	});

	it('rejects a bad from address when the mailer is created', () => {
		expect(() => createMailer({ from: 'a@b.test\r\nBcc: c@d.test', outboxDir: dir })).toThrow(
			MailInputError
		);
	});

	it('rejects a missing text body and an empty subject', async () => {
		const mailer = createMailer({ from: FROM, outboxDir: dir });
		const noText = { to: 'a@example.org', subject: 's' } as unknown as MailMessage;
		await expect(mailer.send(noText)).rejects.toMatchObject({ field: 'text' });
		await expect(
			mailer.send({ to: 'a@example.org', subject: ' ', text: 't' })
		).rejects.toMatchObject({ field: 'subject' });
	});
});

describe('SMTP mailer', () => {
	it('holds a real SMTP conversation with an in-process server', async () => {
		const received: { from: string | false; rcpt: string[]; raw: string }[] = [];
		const server = new SMTPServer({
			secure: false,
			authOptional: true,
			disabledCommands: ['STARTTLS', 'AUTH'],
			logger: false,
			onData(stream, session: SMTPServerSession, callback) {
				const chunks: Buffer[] = [];
				stream.on('data', (c: Buffer) => chunks.push(c));
				stream.on('end', () => {
					received.push({
						from: session.envelope.mailFrom && session.envelope.mailFrom.address,
						rcpt: session.envelope.rcptTo.map((r) => r.address),
						raw: Buffer.concat(chunks).toString('utf8')
					});
					callback();
				});
			}
		});
		await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
		const { port } = server.server.address() as AddressInfo;
		try {
			const { logger } = recordingLogger();
			const mailer = createMailer({
				smtpUrl: `smtp://127.0.0.1:${port}`,
				from: FROM,
				outboxDir: dir,
				logger
			});
			expect(mailer.kind).toBe('smtp');
			const { id } = await mailer.send({
				to: 'ben@example.org',
				subject: 'Reset your password',
				text: `Open ${LINK} within an hour.`
			});
			expect(received).toHaveLength(1);
			expect(received[0].from).toBe(FROM);
			expect(received[0].rcpt).toEqual(['ben@example.org']);
			const eml = await parseEml(received[0].raw);
			expect(eml.subject).toBe('Reset your password');
			expect(eml.messageId).toBe(id);
			// SMTP DATA ends the last line with CRLF (RFC 5321 §4.1.1.4), so one line break is added.
			expect(eml.text).toBe(`Open ${LINK} within an hour.\n`);
			expect(eml.links).toEqual([LINK]);
			await expect(readdir(dir)).resolves.toEqual([]);
		} finally {
			await new Promise<void>((resolve) => server.close(() => resolve()));
		}
	});
});

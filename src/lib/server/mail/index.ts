import nodemailer from 'nodemailer';
import { writeOutboxMessage } from './outbox';

export interface MailMessage {
	to: string;
	subject: string;
	text: string;
	html?: string;
}

export interface MailLogger {
	info(message: string, meta?: Record<string, unknown>): void;
	warn(message: string, meta?: Record<string, unknown>): void;
	error(message: string, meta?: Record<string, unknown>): void;
}

export interface Mailer {
	readonly kind: 'smtp' | 'outbox';
	/** Resolves with the message id: the SMTP Message-ID, or the outbox id. */
	send(msg: MailMessage): Promise<{ id: string }>;
}

export interface MailerConfig {
	/** smtp:// or smtps:// URL; without it every message goes to the outbox directory. */
	smtpUrl?: string;
	from: string;
	outboxDir: string;
	logger?: MailLogger;
}

type MailField = 'from' | 'to' | 'subject' | 'text' | 'html';

/** A message field is unusable; nothing was sent. */
export class MailInputError extends Error {
	readonly field: MailField;
	constructor(field: MailField, problem: string) {
		super(`Mail field "${field}" ${problem}`);
		this.name = 'MailInputError';
		this.field = field;
	}
}

const consoleLogger: MailLogger = {
	info: (m, meta) => console.info(m, meta ?? ''),
	warn: (m, meta) => console.warn(m, meta ?? ''),
	error: (m, meta) => console.error(m, meta ?? '')
};

// One bare address: a display name or a list would let user input choose extra recipients.
const ADDRESS = /^[^\s@<>()[\]\\,;:"]+@[^\s@<>()[\]\\,;:"]+$/;

function checkHeader(field: MailField, value: unknown, max: number): string {
	if (typeof value !== 'string') throw new MailInputError(field, 'must be a string');
	// CR or LF in a header value would start a new header (ASVS 5.0 1.3.11).
	if (/[\r\n]/.test(value)) {
		throw new MailInputError(field, 'must not contain line breaks (CR or LF)');
	}
	if (/[\u0000-\u0008\u000b-\u001f\u007f]/.test(value)) {
		throw new MailInputError(field, 'must not contain control characters');
	}
	if (value.length > max) throw new MailInputError(field, `must be at most ${max} characters`);
	return value;
}

function checkAddress(field: 'from' | 'to', value: unknown): string {
	const address = checkHeader(field, value, 254);
	if (!ADDRESS.test(address)) throw new MailInputError(field, 'must be one plain e-mail address');
	return address;
}

/** Validate a message; throws MailInputError naming the first bad field. */
export function checkMessage(msg: MailMessage): MailMessage {
	if (msg === null || typeof msg !== 'object') throw new MailInputError('to', 'is missing');
	const to = checkAddress('to', msg.to);
	const subject = checkHeader('subject', msg.subject, 200);
	if (subject.trim() === '') throw new MailInputError('subject', 'must not be empty');
	if (typeof msg.text !== 'string') throw new MailInputError('text', 'must be a string');
	if (msg.html !== undefined && typeof msg.html !== 'string') {
		throw new MailInputError('html', 'must be a string');
	}
	return { to, subject, text: msg.text, html: msg.html };
}

/**
 * A mailer: SMTP when smtpUrl is given, otherwise a local outbox of .eml files (development).
 * @throws MailInputError when `from` is not one plain address
 */
export function createMailer(config: MailerConfig): Mailer {
	const from = checkAddress('from', config.from);
	const logger = config.logger ?? consoleLogger;
	if (config.smtpUrl) {
		const transport = nodemailer.createTransport(config.smtpUrl);
		return {
			kind: 'smtp',
			async send(msg) {
				const m = checkMessage(msg);
				const info = await transport.sendMail({ from, ...m });
				logger.info('mail sent', { id: info.messageId, subject: m.subject });
				return { id: info.messageId };
			}
		};
	}
	const transport = nodemailer.createTransport({ streamTransport: true, buffer: true });
	return {
		kind: 'outbox',
		async send(msg) {
			const m = checkMessage(msg);
			const info = await transport.sendMail({ from, ...m });
			const { id, file } = await writeOutboxMessage(config.outboxDir, info.message as Buffer);
			logger.info('mail written to outbox', { id, file, subject: m.subject });
			return { id };
		}
	};
}

export interface MailQueueOptions {
	/** Attempts after the first one; 3 means at most 4 sends. */
	retries?: number;
	/** Delay before the first retry; doubles for each further retry. */
	backoffMs?: number;
	logger?: MailLogger;
	/** Replaceable for tests. */
	sleep?: (ms: number) => Promise<void>;
}

export interface MailQueue {
	/** Send after the current tick, retrying failures; never throws. */
	enqueue(msg: MailMessage): void;
	/** Resolves when every enqueued message has been sent or given up. */
	drain(): Promise<void>;
	readonly pending: number;
}

export function createMailQueue(
	mailer: Pick<Mailer, 'send'>,
	{ retries = 3, backoffMs = 1000, logger = consoleLogger, sleep }: MailQueueOptions = {}
): MailQueue {
	const wait = sleep ?? ((ms: number) => new Promise<void>((r) => setTimeout(r, ms)));
	const jobs = new Set<Promise<void>>();

	async function run(msg: MailMessage): Promise<void> {
		await new Promise<void>((r) => setImmediate(r));
		const subject = typeof msg?.subject === 'string' ? msg.subject : '';
		for (let attempt = 1; ; attempt++) {
			try {
				await mailer.send(msg);
				return;
			} catch (e) {
				const error = e instanceof Error ? e.message : String(e);
				// A bad message stays bad; retrying it only repeats the error.
				if (e instanceof MailInputError || attempt > retries) {
					logger.error('mail not sent; giving up', { subject, attempts: attempt, error });
					return;
				}
				logger.warn('mail send failed; will retry', { subject, attempt, error });
				await wait(backoffMs * 2 ** (attempt - 1));
			}
		}
	}

	return {
		enqueue(msg) {
			const job = run(msg).catch(() => undefined);
			jobs.add(job);
			void job.finally(() => jobs.delete(job));
		},
		async drain() {
			while (jobs.size > 0) await Promise.all([...jobs]);
		},
		get pending() {
			return jobs.size;
		}
	};
}

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
function checkMessage(msg: MailMessage): MailMessage {
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

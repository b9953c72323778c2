import { randomBytes } from 'node:crypto';
import { mkdir, readFile, readdir, rename, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { simpleParser, type AddressObject } from 'mailparser';

/** Outbox ids: basic-format ISO 8601 UTC time, then 64 random bits. Never user-controlled. */
export const OUTBOX_ID = /^\d{8}T\d{6}\.\d{3}Z-[0-9a-f]{16}$/;

export class InvalidOutboxIdError extends Error {
	constructor() {
		super('Outbox message id is not valid');
		this.name = 'InvalidOutboxIdError';
	}
}

export interface OutboxMessage {
	id: string;
	/** Absolute path of the .eml file. */
	file: string;
	from: string;
	to: string;
	subject: string;
	/** ISO 8601 time from the Date header (falls back to the id's time). */
	date: string;
	/** Decoded text/plain body (or the HTML body without tags when there is no text part). */
	text: string;
	html: string | null;
	/** Distinct http(s) links in text and HTML, in order of appearance. */
	links: string[];
}

export interface ParsedEml {
	from: string;
	to: string;
	subject: string;
	messageId: string | null;
	date: Date | null;
	/** The text part, or the HTML part as text when there is none (mailparser makes it). */
	text: string;
	html: string | null;
	/** Distinct http(s) links in text and HTML, in order of appearance. */
	links: string[];
}

export function newOutboxId(now = new Date()): string {
	return `${now.toISOString().replace(/[-:]/g, '')}-${randomBytes(8).toString('hex')}`;
}

/** Write raw RFC 822 bytes as a new .eml file; rename makes it appear whole or not at all. */
export async function writeOutboxMessage(
	outboxDir: string,
	raw: Uint8Array
): Promise<{ id: string; file: string }> {
	await mkdir(outboxDir, { recursive: true });
	const id = newOutboxId();
	const file = path.join(outboxDir, `${id}.eml`);
	const tmp = path.join(outboxDir, `.${id}.tmp`);
	await writeFile(tmp, raw, { flag: 'wx', mode: 0o600 });
	await rename(tmp, file);
	return { id, file };
}

export async function listOutbox(
	outboxDir: string,
	{ limit = 50 }: { limit?: number } = {}
): Promise<OutboxMessage[]> {
	const max = Number.isFinite(limit) ? Math.min(1000, Math.max(0, Math.floor(limit))) : 50;
	let names: string[];
	try {
		names = await readdir(outboxDir);
	} catch (e) {
		if ((e as NodeJS.ErrnoException).code === 'ENOENT') return [];
		throw e;
	}
	const ids = names
		.filter((n) => n.endsWith('.eml') && OUTBOX_ID.test(n.slice(0, -4)))
		.map((n) => n.slice(0, -4))
		.sort()
		.reverse()
		.slice(0, max);
	const messages = await Promise.all(ids.map((id) => load(outboxDir, id)));
	return messages.filter((m): m is OutboxMessage => m !== null);
}

/**
 * One outbox message, or null when no such file exists.
 * @throws InvalidOutboxIdError when id does not match OUTBOX_ID (stops path traversal)
 */
export async function readOutboxMessage(
	outboxDir: string,
	id: string
): Promise<OutboxMessage | null> {
	if (typeof id !== 'string' || !OUTBOX_ID.test(id)) throw new InvalidOutboxIdError();
	return load(outboxDir, id);
}

async function load(outboxDir: string, id: string): Promise<OutboxMessage | null> {
	const file = path.join(outboxDir, `${id}.eml`);
	let raw: Buffer;
	try {
		raw = await readFile(file);
	} catch (e) {
		if ((e as NodeJS.ErrnoException).code === 'ENOENT') return null;
		throw e;
	}
	const eml = await parseEml(raw);
	const idTime = id.replace(
		/^(\d{4})(\d\d)(\d\d)T(\d\d)(\d\d)(\d\d)(\.\d{3}Z).*$/,
		'$1-$2-$3T$4:$5:$6$7'
	);
	return {
		id,
		file,
		from: eml.from,
		to: eml.to,
		subject: eml.subject,
		date: eml.date ? eml.date.toISOString() : idTime,
		text: eml.text,
		html: eml.html,
		links: eml.links
	};
}

const addresses = (a: AddressObject | AddressObject[] | undefined) =>
	(Array.isArray(a) ? a : a ? [a] : []).map((x) => x.text).join(', ');

/** An RFC 822 / MIME message, read by mailparser: decoded headers, the text and HTML bodies, links. */
export async function parseEml(raw: string | Buffer): Promise<ParsedEml> {
	const m = await simpleParser(raw, { skipImageLinks: true, skipTextToHtml: true });
	const html = m.html === false || m.html === undefined ? null : m.html;
	const date = m.date && !Number.isNaN(m.date.getTime()) ? m.date : null;
	return {
		from: addresses(m.from),
		to: addresses(m.to),
		subject: m.subject ?? '',
		messageId: m.messageId ?? null,
		date,
		text: m.text ?? '',
		html,
		links: extractLinks([m.text ?? '', (html ?? '').replace(/&amp;/g, '&')])
	};
}

function extractLinks(sources: string[]): string[] {
	const links: string[] = [];
	for (const source of sources) {
		for (const [match] of source.matchAll(/https?:\/\/[^\s<>"'`]+/g)) {
			const link = match.replace(/[.,;:!?)\]]+$/, '');
			if (!links.includes(link)) links.push(link);
		}
	}
	return links;
}

import { randomBytes } from 'node:crypto';
import { mkdir, readFile, readdir, rename, writeFile } from 'node:fs/promises';
import path from 'node:path';

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
	headers: Map<string, string>;
	text: string | null;
	html: string | null;
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
	let raw: string;
	try {
		raw = await readFile(file, 'utf8');
	} catch (e) {
		if ((e as NodeJS.ErrnoException).code === 'ENOENT') return null;
		throw e;
	}
	const eml = parseEml(raw);
	const header = (name: string) => eml.headers.get(name) ?? '';
	const dated = new Date(header('date'));
	const idTime = id.replace(
		/^(\d{4})(\d\d)(\d\d)T(\d\d)(\d\d)(\d\d)(\.\d{3}Z).*$/,
		'$1-$2-$3T$4:$5:$6$7'
	);
	return {
		id,
		file,
		from: header('from'),
		to: header('to'),
		subject: header('subject'),
		date: Number.isNaN(dated.getTime()) ? idTime : dated.toISOString(),
		text: eml.text ?? (eml.html === null ? '' : htmlToText(eml.html)),
		html: eml.html,
		links: eml.links
	};
}

/** Parse an RFC 822 / MIME message: decoded headers, the first text and HTML parts, links. */
export function parseEml(raw: string): ParsedEml {
	const root = parseEntity(raw.replace(/\r\n/g, '\n'));
	const found: { text: string | null; html: string | null } = { text: null, html: null };
	collectParts(root, found);
	const links = extractLinks([found.text ?? '', (found.html ?? '').replace(/&amp;/g, '&')]);
	return { headers: root.headers, text: found.text, html: found.html, links };
}

interface Entity {
	headers: Map<string, string>;
	body: string;
}

function parseEntity(source: string): Entity {
	const split = source.indexOf('\n\n');
	const head = split === -1 ? source : source.slice(0, split);
	const body = split === -1 ? '' : source.slice(split + 2);
	const headers = new Map<string, string>();
	for (const line of head.replace(/\n[ \t]+/g, ' ').split('\n')) {
		const colon = line.indexOf(':');
		if (colon <= 0) continue;
		const name = line.slice(0, colon).trim().toLowerCase();
		if (!headers.has(name)) headers.set(name, decodeEncodedWords(line.slice(colon + 1).trim()));
	}
	return { headers, body };
}

function collectParts(entity: Entity, found: { text: string | null; html: string | null }): void {
	const { type, params } = parseContentType(entity.headers.get('content-type') ?? 'text/plain');
	if (/^attachment/i.test(entity.headers.get('content-disposition') ?? '')) return;
	if (type.startsWith('multipart/') && params.boundary) {
		for (const part of splitMultipart(entity.body, params.boundary)) collectParts(part, found);
		return;
	}
	if (type !== 'text/plain' && type !== 'text/html') return;
	const cte = (entity.headers.get('content-transfer-encoding') ?? '7bit').toLowerCase();
	const content = decodeBody(entity.body, cte, params.charset ?? 'utf-8');
	if (type === 'text/plain' && found.text === null) found.text = content;
	if (type === 'text/html' && found.html === null) found.html = content;
}

function parseContentType(value: string): { type: string; params: Record<string, string> } {
	const [type, ...rest] = value.split(';');
	const params: Record<string, string> = {};
	for (const p of rest) {
		const eq = p.indexOf('=');
		if (eq === -1) continue;
		const key = p.slice(0, eq).trim().toLowerCase();
		params[key] = p
			.slice(eq + 1)
			.trim()
			.replace(/^"(.*)"$/, '$1');
	}
	return { type: type.trim().toLowerCase(), params };
}

function splitMultipart(body: string, boundary: string): Entity[] {
	// The line break before a delimiter belongs to the delimiter (RFC 2046 §5.1.1).
	const segments = `\n${body}`.split(`\n--${boundary}`);
	const parts: Entity[] = [];
	for (const segment of segments.slice(1)) {
		if (segment.startsWith('--')) break;
		const lineEnd = segment.indexOf('\n');
		if (lineEnd !== -1) parts.push(parseEntity(segment.slice(lineEnd + 1)));
	}
	return parts;
}

function decodeBody(body: string, cte: string, charset: string): string {
	if (cte === 'quoted-printable') return decodeBytes(decodeQuotedPrintable(body), charset);
	if (cte === 'base64')
		return decodeBytes(Buffer.from(body.replace(/\s+/g, ''), 'base64'), charset);
	return body;
}

/** RFC 2045 §6.7: `=XX` is a byte, `=` at a line end is a soft line break. */
export function decodeQuotedPrintable(input: string): Uint8Array {
	const text = input.replace(/[ \t]+$/gm, '').replace(/=\n/g, '');
	const bytes: number[] = [];
	for (let i = 0; i < text.length; i++) {
		const hex = text.slice(i + 1, i + 3);
		if (text[i] === '=' && /^[0-9A-Fa-f]{2}$/.test(hex)) {
			bytes.push(parseInt(hex, 16));
			i += 2;
		} else {
			bytes.push(...Buffer.from(text[i], 'utf8'));
		}
	}
	return Uint8Array.from(bytes);
}

function decodeBytes(bytes: Uint8Array, charset: string): string {
	try {
		return new TextDecoder(charset).decode(bytes);
	} catch {
		return new TextDecoder('utf-8').decode(bytes);
	}
}

const ENCODED_WORD = /=\?([^?\s]+)\?([bq])\?([^?\s]*)\?=/gi;

/** RFC 2047 encoded words; white space between adjacent encoded words is dropped (§6.2). */
export function decodeEncodedWords(value: string): string {
	return value
		.replace(/(\?=)\s+(?==\?)/g, '$1')
		.replace(ENCODED_WORD, (_m, charset: string, enc: string, data: string) => {
			const bytes =
				enc.toLowerCase() === 'b'
					? Buffer.from(data, 'base64')
					: decodeQuotedPrintable(data.replace(/_/g, ' '));
			return decodeBytes(bytes, charset);
		});
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

function htmlToText(html: string): string {
	return html
		.replace(/<(script|style)[\s\S]*?<\/\1>/gi, '')
		.replace(/<[^>]*>/g, ' ')
		.replace(/&nbsp;/g, ' ')
		.replace(/&lt;/g, '<')
		.replace(/&gt;/g, '>')
		.replace(/&quot;/g, '"')
		.replace(/&amp;/g, '&')
		.replace(/[ \t]+/g, ' ')
		.trim();
}

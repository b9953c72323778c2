/** What sweep and image uploads share: who may upload to a revision, the error class, capped reads. */
import type { Revision } from '../db/schema';
import type { SessionUser } from '../accounts/auth';
import { DomainError } from '../http/errors';

/** A refused upload: status, a message for people, and where it has one the field, line and column. */
export class UploadError extends DomainError {
	constructor(
		status: 400 | 403 | 404 | 409 | 413 | 415 | 422 | 429,
		message: string,
		field?: string,
		readonly line?: number,
		readonly column?: number
	) {
		super(status, message, field);
		this.name = 'UploadError';
	}

	/** The JSON error body of the API: `{ message, field?, line?, column? }`. */
	toJSON(): Record<string, unknown> {
		const out = super.toJSON();
		if (this.line !== undefined) out.line = this.line;
		if (this.column !== undefined) out.column = this.column;
		return out;
	}
}

export type UploadKind = 'measurement' | 'build_report';

/**
 * The author uploads measurements to their own revision (any state: measuring before submitting is
 * normal). Anyone else files a build report, on an approved revision, or, until peer review is
 * running, a submitted one (shown as "built from an unreviewed revision").
 */
export function uploadAccess(
	user: SessionUser | null,
	r: Pick<Revision, 'authorId' | 'state' | 'number'>
): { ok: true; kind: UploadKind } | { ok: false; status: 401 | 403 | 409; message: string } {
	if (!user)
		return { ok: false, status: 401, message: 'Sign in to upload measurements or photos.' };
	if (!user.emailVerified) {
		return {
			ok: false,
			status: 403,
			message: 'Verify your e-mail address first (see your account page).'
		};
	}
	if (r.authorId === user.id) return { ok: true, kind: 'measurement' };
	if (r.state === 'approved' || r.state === 'submitted') return { ok: true, kind: 'build_report' };
	return {
		ok: false,
		status: 409,
		message: `r${r.number} is ${r.state}: build reports go on approved or submitted revisions.`
	};
}

export function assertUploadAccess(user: SessionUser | null, r: Revision): UploadKind {
	const access = uploadAccess(user, r);
	if (!access.ok)
		throw new UploadError(access.status === 401 ? 403 : access.status, access.message);
	return access.kind;
}

const megabytes = (n: number) => `${(n / (1024 * 1024)).toFixed(1)} MB`;

export function tooLarge(size: number, max: number, what: string): UploadError {
	return new UploadError(
		413,
		`The file is ${megabytes(size)}; ${what} may be at most ${Math.round(max / (1024 * 1024))} MB.`,
		'file'
	);
}

/** The request body, refused as soon as it passes max bytes (declared or streamed). */
export async function readBodyLimited(
	request: Request,
	max: number,
	what: string
): Promise<Uint8Array> {
	const declared = Number(request.headers.get('content-length'));
	if (Number.isFinite(declared) && declared > max) throw tooLarge(declared, max, what);
	if (!request.body) return new Uint8Array(0);
	const reader = request.body.getReader();
	const chunks: Uint8Array[] = [];
	let total = 0;
	for (;;) {
		const { done, value } = await reader.read();
		if (done) break;
		total += value.byteLength;
		if (total > max) {
			await reader.cancel().catch(() => undefined);
			throw tooLarge(total, max, what);
		}
		chunks.push(value);
	}
	const out = new Uint8Array(total);
	let at = 0;
	for (const c of chunks) {
		out.set(c, at);
		at += c.byteLength;
	}
	return out;
}

/** A download name: the user's base name reduced to safe characters, with the extension we chose. */
export function safeFileName(name: string, ext: string, fallback = 'file'): string {
	const base = (name.split(/[/\\]/).pop() ?? '')
		.replace(/\.[A-Za-z0-9]{1,5}$/, '')
		.normalize('NFKD')
		.replace(/[^A-Za-z0-9._ -]+/g, '_')
		.replace(/^[._ -]+|[._ -]+$/g, '')
		.slice(0, 100);
	return `${base || fallback}.${ext}`;
}

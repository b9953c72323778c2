import { error } from '@sveltejs/kit';
import { getAttachment } from '$lib/server/measurements/attachments';
import { blobStore } from '$lib/server/storage/from-env';
import { getMeasurement } from '$lib/server/measurements/measurements';
import { canRead, getRevisionById } from '$lib/server/designs/lookups';
import type { RequestHandler } from './$types';

const VARIANTS = ['display', 'thumb', 'original'] as const;
type Variant = (typeof VARIANTS)[number];
const EXT: Record<string, string> = {
	'image/webp': 'webp',
	'image/jpeg': 'jpg',
	'image/png': 'png'
};

/** RFC 6266 Content-Disposition with an ASCII fallback and the RFC 8187 UTF-8 name. */
function disposition(kind: 'attachment' | 'inline', name: string): string {
	const ascii = name.replace(/[^\x20-\x7e]/g, '_').replace(/["\\]/g, '_');
	return `${kind}; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(name)}`;
}

/**
 * Stored files by id: a measurement's original sweep (?v ignored), or an attachment's display
 * image, thumbnail or kept full-size image (?v=display|thumb|original). Keys never come from the
 * URL; the revision must be readable by the requester. Served with the stored type, nosniff and
 * a sandbox CSP, so a file can never run as a page.
 */
export const GET: RequestHandler = async ({ params, url, locals }) => {
	const notFound = () => error(404, 'No such file.');
	let key: string;
	let type: string;
	let headers: Record<string, string>;
	let draft: boolean;
	const m = getMeasurement(params.id);
	if (m) {
		const r = getRevisionById(m.revisionId);
		if (!r || !canRead(locals.user, r)) notFound();
		draft = r!.state === 'draft';
		key = m.fileKey;
		type = m.fileType;
		headers = { 'content-disposition': disposition('attachment', m.fileName) };
	} else {
		const a = getAttachment(params.id);
		const r = a ? getRevisionById(a.revisionId) : null;
		if (!a || !r || !canRead(locals.user, r)) notFound();
		draft = r!.state === 'draft';
		const v = (url.searchParams.get('v') ?? 'display') as Variant;
		if (!VARIANTS.includes(v)) error(400, 'v must be display, thumb or original.');
		if (v === 'original' && !a!.originalKey)
			error(404, 'The uploader did not keep the full-size image.');
		key = v === 'original' ? a!.originalKey! : v === 'thumb' ? a!.thumbKey : a!.displayKey;
		type = v === 'original' ? a!.originalType! : 'image/webp';
		headers = {
			'content-disposition': disposition('inline', `image-${a!.id}-${v}.${EXT[type] ?? 'bin'}`)
		};
	}
	const bytes = await blobStore().get(key);
	if (!bytes) notFound();
	return new Response(bytes as Uint8Array<ArrayBuffer>, {
		headers: {
			...headers,
			'content-type': type,
			'content-length': String(bytes!.byteLength),
			'x-content-type-options': 'nosniff',
			'content-security-policy': "default-src 'none'; sandbox",
			// A draft's files are its author's alone: never kept once the session is gone.
			'cache-control': draft ? 'private, no-store' : 'private, max-age=3600'
		}
	});
};

/** Photos and sweep screenshots on a revision, re-encoded by sharp before anything is stored. */
import sharp from 'sharp';
import { asc, eq, sql } from 'drizzle-orm';
import { firstIssue, photoFormSchema } from '$lib/schemas/measurement';
import { db } from '../db';
import { attachments, users, type Revision } from '../db/schema';
import type { SessionUser } from '../accounts/auth';
import { newId } from '../accounts/accounts';
import { audit } from '../moderation/audit';
import { blobStore } from '../storage/from-env';
import { newBlobKey } from '../storage/blob';
import { acceptedImage, sniff, type ImageType } from './sniff';
import { assertUploadAccess, tooLarge, UploadError } from './uploads';

export const MAX_IMAGE_BYTES = 15 * 1024 * 1024;
export const MAX_IMAGE_PIXELS = 50_000_000;
export const DISPLAY_MAX_PX = 1600;
export const THUMB_MAX_PX = 320;
const DISPLAY_TYPE = 'image/webp';

export interface ProcessedImage {
	type: ImageType;
	width: number;
	height: number;
	display: Buffer;
	thumb: Buffer;
	original: { bytes: Buffer; type: ImageType } | null;
}

const SHARP_FORMAT: Record<ImageType, string> = {
	'image/jpeg': 'jpeg',
	'image/png': 'png',
	'image/webp': 'webp'
};

// Header reads only: sharp's metadata() does not decode pixels.
async function header(bytes: Uint8Array) {
	try {
		return await sharp(bytes, { limitInputPixels: false }).metadata();
	} catch {
		throw new UploadError(
			422,
			'The image header cannot be read: the file is damaged or not really an image.',
			'file'
		);
	}
}

/**
 * Type from the bytes (JPEG, PNG, WebP only), ≤ 15 MB and ≤ 50 megapixels from the header before
 * decoding, then re-encoded: orientation applied, every metadata block (EXIF with GPS, XMP, ICC
 * comments) dropped, a ≤ 1600 px WebP display copy and a ≤ 320 px thumbnail, and on request the
 * full-size image re-encoded in its own format (also without metadata).
 */
export async function processImage(
	bytes: Uint8Array,
	keepOriginal = false
): Promise<ProcessedImage> {
	if (bytes.byteLength === 0) throw new UploadError(422, 'The file is empty.', 'file');
	if (bytes.byteLength > MAX_IMAGE_BYTES)
		throw tooLarge(bytes.byteLength, MAX_IMAGE_BYTES, 'an image');
	const found = sniff(bytes);
	const type = acceptedImage(found);
	if (!type) {
		throw new UploadError(415, `This is ${found.label}; upload a JPEG, PNG or WebP image.`, 'file');
	}
	const meta = await header(bytes);
	if (meta.format !== SHARP_FORMAT[type]) {
		throw new UploadError(422, 'The image is damaged: its contents do not match its type.', 'file');
	}
	const w = meta.width ?? 0;
	const h = meta.height ?? 0;
	if (w * h > MAX_IMAGE_PIXELS) {
		throw new UploadError(
			422,
			`The image is ${w} × ${h} pixels (${Math.round((w * h) / 1e6)} megapixels); the limit is ${MAX_IMAGE_PIXELS / 1e6} megapixels.`,
			'file'
		);
	}
	const input = () =>
		sharp(bytes, { limitInputPixels: MAX_IMAGE_PIXELS, failOn: 'warning' }).rotate();
	try {
		const display = await input()
			.resize({
				width: DISPLAY_MAX_PX,
				height: DISPLAY_MAX_PX,
				fit: 'inside',
				withoutEnlargement: true
			})
			.webp({ quality: 82 })
			.toBuffer({ resolveWithObject: true });
		const thumb = await sharp(display.data)
			.resize({
				width: THUMB_MAX_PX,
				height: THUMB_MAX_PX,
				fit: 'inside',
				withoutEnlargement: true
			})
			.webp({ quality: 72 })
			.toBuffer();
		let original: ProcessedImage['original'] = null;
		if (keepOriginal) {
			const full = input();
			const encoded =
				type === 'image/jpeg'
					? full.jpeg({ quality: 92 })
					: type === 'image/png'
						? full.png({ compressionLevel: 6 })
						: full.webp({ quality: 92 });
			original = { bytes: await encoded.toBuffer(), type };
		}
		const oriented = (meta.orientation ?? 1) >= 5;
		return {
			type,
			width: oriented ? h : w,
			height: oriented ? w : h,
			display: display.data,
			thumb,
			original
		};
	} catch (e) {
		if (e instanceof UploadError) throw e;
		const detail = e instanceof Error ? e.message.split('\n')[0].slice(0, 160) : '';
		throw new UploadError(
			422,
			`The image cannot be decoded: it is damaged or truncated${detail ? ` (${detail})` : ''}.`,
			'file'
		);
	}
}

/**
 * Adds a photo or sweep image. Access as for sweeps (own revision, or someone else's approved or
 * submitted one). Blobs first, then the row; any failure removes the blobs already written.
 * @throws UploadError for anything the uploader can fix; nothing is stored then.
 */
export async function addAttachment(
	user: SessionUser,
	r: Revision,
	input: { fields: Record<string, string>; file: { bytes: Uint8Array; name: string } },
	options: { now?: Date } = {}
): Promise<{ id: string }> {
	assertUploadAccess(user, r);
	const parsed = photoFormSchema.safeParse(input.fields);
	if (!parsed.success) {
		const i = firstIssue(parsed.error);
		throw new UploadError(400, i.message.charAt(0).toUpperCase() + i.message.slice(1), i.field);
	}
	const form = parsed.data;
	const image = await processImage(input.file.bytes, form.keep_original);
	const store = blobStore();
	const written: string[] = [];
	const put = async (bytes: Buffer, type: string) => {
		const key = newBlobKey('images', options.now);
		written.push(key);
		await store.put(key, new Uint8Array(bytes.buffer, bytes.byteOffset, bytes.byteLength), type);
		return key;
	};
	const id = newId();
	try {
		const displayKey = await put(image.display, DISPLAY_TYPE);
		const thumbKey = await put(image.thumb, DISPLAY_TYPE);
		const originalKey = image.original
			? await put(image.original.bytes, image.original.type)
			: null;
		db.transaction((tx) => {
			tx.insert(attachments)
				.values({
					id,
					revisionId: r.id,
					uploaderId: user.id,
					kind: form.kind,
					caption: form.caption,
					displayKey,
					thumbKey,
					originalKey,
					originalType: image.original?.type ?? null,
					width: image.width,
					height: image.height,
					...(options.now ? { createdAt: options.now } : {})
				})
				.run();
			audit(
				{
					actorId: user.id,
					action: 'attachment.add',
					targetType: 'attachment',
					targetId: id,
					details: { revisionId: r.id, number: r.number, kind: form.kind, original: !!originalKey }
				},
				tx
			);
		});
	} catch (e) {
		await Promise.all(written.map((k) => store.delete(k).catch(() => undefined)));
		throw e;
	}
	return { id };
}

export function getAttachment(id: string) {
	if (!/^[a-z2-7]{24}$/.test(id)) return null;
	return db.select().from(attachments).where(eq(attachments.id, id)).get() ?? null;
}

const attachmentsOfRevision = db
	.select({
		id: attachments.id,
		kind: attachments.kind,
		caption: attachments.caption,
		width: attachments.width,
		height: attachments.height,
		hasOriginal: attachments.originalKey,
		uploader: users.displayName,
		createdAt: attachments.createdAt
	})
	.from(attachments)
	.innerJoin(users, eq(users.id, attachments.uploaderId))
	.where(eq(attachments.revisionId, sql.placeholder('revisionId')))
	.orderBy(asc(attachments.createdAt), asc(attachments.id))
	.prepare();

export function listAttachments(revisionId: string) {
	return attachmentsOfRevision.all({ revisionId }).map((a) => ({
		...a,
		hasOriginal: a.hasOriginal !== null,
		createdAt: a.createdAt.toISOString()
	}));
}

import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SessionUser } from '../accounts/auth';
import type { Revision } from '../db/schema';
import {
	addAttachment,
	getAttachment,
	listAttachments,
	processImage,
	THUMB_MAX_PX,
	DISPLAY_MAX_PX
} from './attachments';
import { UploadError } from './uploads';
import { exifHasGps, jpegWithGps, pngHeaderOnly, solidPng } from '../../testing/upload-fixtures';
import { designAt, member, rowCounts, tempStore, type TempStore } from '../../testing/server-setup';

let author: SessionUser;
let builder: SessionUser;
let r: Revision;
let temp: TempStore;

beforeAll(async () => {
	author = await member('photo-author@example.org');
	builder = await member('photo-builder@example.org');
	r = designAt(author, 'Photo test design', 2.45e9, [2.4e9, 2.5e9]);
	temp = await tempStore();
});
afterAll(() => temp.cleanup());

const upload = (
	bytes: Uint8Array,
	name: string,
	fields: Record<string, string> = {},
	who = author
) => addAttachment(who, r, { fields: { caption: 'test', ...fields }, file: { bytes, name } });

async function expectRefused(run: () => Promise<unknown>, status: number, message: RegExp) {
	const before = rowCounts();
	const blobs = (await temp.files()).length;
	const err = await run().then(
		() => null,
		(e: unknown) => e
	);
	expect(err).toBeInstanceOf(UploadError);
	expect((err as UploadError).status).toBe(status);
	expect((err as UploadError).message).toMatch(message);
	expect(rowCounts()).toEqual(before);
	expect((await temp.files()).length).toBe(blobs);
}

describe('photos', () => {
	it('re-encodes a JPEG: orientation applied, EXIF with GPS gone, display and thumbnail sizes', async () => {
		// EXIF orientation 6 = rotate 90° clockwise to display (EXIF 2.32, CIPA DC-008, tag 0x0112)
		const input = await jpegWithGps(2400, 1200, 6);
		const inMeta = await sharp(input).metadata();
		expect(exifHasGps(inMeta.exif)).toBe(true);
		expect(inMeta.orientation).toBe(6);
		const out = await processImage(input);
		expect(out.type).toBe('image/jpeg');
		expect([out.width, out.height]).toEqual([1200, 2400]);
		const display = await sharp(out.display).metadata();
		expect(display.format).toBe('webp');
		expect(display.exif).toBeUndefined();
		expect(display.xmp).toBeUndefined();
		expect(display.orientation).toBeUndefined();
		// 1600 px long side, upright: 800 × 1600
		expect([display.width, display.height]).toEqual([DISPLAY_MAX_PX / 2, DISPLAY_MAX_PX]);
		const thumb = await sharp(out.thumb).metadata();
		expect(Math.max(thumb.width!, thumb.height!)).toBe(THUMB_MAX_PX);
		expect(thumb.exif).toBeUndefined();
		expect(out.original).toBeNull();
	});

	it('stores display and thumbnail, and the full-size image only when asked (without metadata)', async () => {
		const before = (await temp.files()).length;
		const plain = await upload(await jpegWithGps(640, 480), 'a.jpg');
		expect((await temp.files()).length).toBe(before + 2);
		expect(getAttachment(plain.id)!.originalKey).toBeNull();
		const kept = await upload(await jpegWithGps(640, 480), 'b.jpg', { keep_original: 'on' });
		expect((await temp.files()).length).toBe(before + 5);
		const row = getAttachment(kept.id)!;
		expect(row.originalType).toBe('image/jpeg');
		const original = await sharp((await temp.store.get(row.originalKey!))!).metadata();
		expect([original.width, original.height]).toEqual([640, 480]);
		expect(original.exif).toBeUndefined();
		expect(listAttachments(r.id).map((a) => a.id)).toEqual([plain.id, kept.id]);
	});

	it('takes the type from the bytes: a PNG named .jpg is a PNG', async () => {
		const made = await upload(await solidPng(300, 200), 'holiday.jpg');
		expect(getAttachment(made.id)!.width).toBe(300);
		const out = await processImage(await solidPng(300, 200));
		expect(out.type).toBe('image/png');
	});

	it('lets another member add build photos to a submitted revision', async () => {
		const made = await upload(await solidPng(64, 64), 'mine.png', { kind: 'sweep_image' }, builder);
		expect(getAttachment(made.id)!.kind).toBe('sweep_image');
	});
});

describe('bad images', () => {
	it('20 000 × 20 000 pixels is refused from the header alone', async () => {
		const png = pngHeaderOnly(20_000, 20_000);
		expect(png.length).toBeLessThan(100);
		// 50 MP pixel limit: SECURITY.md (OWASP file upload guidance, sharp limitInputPixels)
		await expectRefused(
			() => upload(png, 'huge.png'),
			422,
			/20000 × 20000 pixels \(400 megapixels\).*50 megapixels/
		);
	});

	it('a truncated JPEG', async () => {
		const whole = await jpegWithGps(800, 600);
		await expectRefused(
			() => upload(whole.subarray(0, Math.floor(whole.length * 0.6)), 'cut.jpg'),
			422,
			/damaged or truncated/
		);
	});

	it('a type outside JPEG, PNG and WebP, and text with an image name', async () => {
		const gif = Buffer.from('GIF89a\x01\x00\x01\x00\x00\x00\x00;', 'latin1');
		await expectRefused(() => upload(gif, 'x.gif'), 415, /GIF image; upload a JPEG, PNG or WebP/);
		await expectRefused(
			() => upload(new TextEncoder().encode('# MHz S MA R 50\n'), 'sweep.png'),
			415,
			/This is text/
		);
	});

	it('an empty file and one over 15 MB', async () => {
		await expectRefused(() => upload(new Uint8Array(0), 'empty.jpg'), 422, /empty/);
		const big = new Uint8Array(16 * 1024 * 1024);
		big.set([0xff, 0xd8, 0xff]);
		await expectRefused(() => upload(big, 'big.jpg'), 413, /16\.0 MB.*at most 15 MB/);
	});

	it('a caption that is too long', async () => {
		await expectRefused(
			() => upload(pngHeaderOnly(10, 10), 'x.png', { caption: 'x'.repeat(301) }),
			400,
			/caption/i
		);
	});
});

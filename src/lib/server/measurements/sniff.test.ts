import { describe, expect, it } from 'vitest';
import { acceptedImage, sniff } from './sniff';
import { jpegWithGps, pngHeaderOnly } from '../../testing/upload-fixtures';

const b = (...xs: number[]) => new Uint8Array(xs);
const ascii = (s: string) => new Uint8Array([...s].map((c) => c.charCodeAt(0)));

describe('sniff', () => {
	it('knows the accepted images by their signatures', async () => {
		// JPEG SOI FF D8 then a marker FF (ITU-T T.81 Annex B); PNG 89 50 4E 47 0D 0A 1A 0A (PNG 2nd ed. §5.2);
		// WebP "RIFF" size "WEBP" (RFC 9649 §2.5)
		expect(sniff(await jpegWithGps(8, 8)).mime).toBe('image/jpeg');
		expect(sniff(pngHeaderOnly(1, 1)).mime).toBe('image/png');
		expect(sniff(ascii('RIFF\x10\x00\x00\x00WEBPVP8 ')).mime).toBe('image/webp');
		expect(acceptedImage(sniff(ascii('RIFF\x10\x00\x00\x00WEBPVP8 ')))).toBe('image/webp');
	});

	it('names other types and accepts none of them as images', () => {
		const cases: [Uint8Array, string][] = [
			[ascii('GIF89a....'), 'image/gif'], // GIF89a spec header
			[b(0x49, 0x49, 0x2a, 0x00, 8), 'image/tiff'], // TIFF 6.0 §2 header
			[ascii('%PDF-1.7\n'), 'application/pdf'], // ISO 32000-1 §7.5.2
			[b(0x50, 0x4b, 0x03, 0x04, 0), 'application/zip'], // PKWARE APPNOTE 4.3.7
			[b(0x1f, 0x8b, 8, 0), 'application/gzip'], // RFC 1952 §2.3.1
			[ascii('\x00\x00\x00\x18ftypheic'), 'image/heif'] // ISO/IEC 14496-12 ftyp box
		];
		for (const [bytes, mime] of cases) {
			expect(sniff(bytes).mime).toBe(mime);
			expect(acceptedImage(sniff(bytes))).toBeNull();
		}
	});

	it('tells text from binary: UTF-8 without NUL is text', () => {
		expect(sniff(new TextEncoder().encode('# MHz S DB R 50\n2400 -12 30\n')).kind).toBe('text');
		expect(sniff(new TextEncoder().encode('Fréquence;Perte (dB)\n')).kind).toBe('text');
		expect(sniff(b(0x41, 0x00, 0x42)).kind).toBe('binary');
		expect(sniff(b(0x41, 0xc3, 0x28)).kind).toBe('binary'); // invalid UTF-8 continuation
		expect(sniff(new Uint8Array(0)).kind).toBe('empty');
	});

	it('ignores a multi-byte character cut at the end of the probe window', () => {
		const text = 'a'.repeat(64 * 1024 - 1) + 'é' + 'b'.repeat(10);
		expect(sniff(new TextEncoder().encode(text)).kind).toBe('text');
	});
});

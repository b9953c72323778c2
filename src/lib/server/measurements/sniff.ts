/**
 * File type from the leading bytes, never from the name or the declared type. Signatures: JPEG
 * (JFIF/Exif SOI FF D8 FF), PNG (RFC 2083 §3.1), WebP (RIFF…WEBP, RFC 9649 §2), GIF, PDF, ZIP,
 * gzip (RFC 1952), TIFF, BMP, ISO-BMFF (HEIC/AVIF "ftyp"), 7z, RAR.
 */

export type ImageType = 'image/jpeg' | 'image/png' | 'image/webp';

export interface Sniffed {
	/** Media type of what the bytes are; 'text/plain' for text, 'application/octet-stream' when unknown. */
	mime: string;
	/** Words for messages: "a PNG image", "text". */
	label: string;
	kind: 'image' | 'text' | 'archive' | 'document' | 'binary' | 'empty';
}

const ACCEPTED_IMAGES: readonly ImageType[] = ['image/jpeg', 'image/png', 'image/webp'];

const ascii = (b: Uint8Array, at: number, s: string) => {
	if (b.length < at + s.length) return false;
	for (let i = 0; i < s.length; i++) if (b[at + i] !== s.charCodeAt(i)) return false;
	return true;
};
const bytesAt = (b: Uint8Array, at: number, sig: number[]) =>
	b.length >= at + sig.length && sig.every((x, i) => b[at + i] === x);

const SIGNATURES: { test: (b: Uint8Array) => boolean; sniffed: Sniffed }[] = [
	{
		test: (b) => bytesAt(b, 0, [0xff, 0xd8, 0xff]),
		sniffed: { mime: 'image/jpeg', label: 'a JPEG image', kind: 'image' }
	},
	{
		test: (b) => bytesAt(b, 0, [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
		sniffed: { mime: 'image/png', label: 'a PNG image', kind: 'image' }
	},
	{
		test: (b) => ascii(b, 0, 'RIFF') && ascii(b, 8, 'WEBP'),
		sniffed: { mime: 'image/webp', label: 'a WebP image', kind: 'image' }
	},
	{
		test: (b) => ascii(b, 0, 'GIF87a') || ascii(b, 0, 'GIF89a'),
		sniffed: { mime: 'image/gif', label: 'a GIF image', kind: 'image' }
	},
	{
		test: (b) => bytesAt(b, 0, [0x49, 0x49, 0x2a, 0x00]) || bytesAt(b, 0, [0x4d, 0x4d, 0x00, 0x2a]),
		sniffed: { mime: 'image/tiff', label: 'a TIFF image', kind: 'image' }
	},
	{
		test: (b) => ascii(b, 0, 'BM') && b.length > 14,
		sniffed: { mime: 'image/bmp', label: 'a BMP image', kind: 'image' }
	},
	{
		test: (b) =>
			ascii(b, 4, 'ftyp') &&
			/^(heic|heix|mif1|avif|avis)/.test(String.fromCharCode(...b.subarray(8, 12))),
		sniffed: { mime: 'image/heif', label: 'a HEIC/AVIF image', kind: 'image' }
	},
	{
		test: (b) => ascii(b, 0, '%PDF-'),
		sniffed: { mime: 'application/pdf', label: 'a PDF document', kind: 'document' }
	},
	{
		test: (b) => bytesAt(b, 0, [0x50, 0x4b, 0x03, 0x04]),
		sniffed: {
			mime: 'application/zip',
			label: 'a ZIP archive (or an Office document)',
			kind: 'archive'
		}
	},
	{
		test: (b) => bytesAt(b, 0, [0x1f, 0x8b]),
		sniffed: { mime: 'application/gzip', label: 'a gzip archive', kind: 'archive' }
	},
	{
		test: (b) => bytesAt(b, 0, [0x37, 0x7a, 0xbc, 0xaf, 0x27, 0x1c]),
		sniffed: { mime: 'application/x-7z-compressed', label: 'a 7z archive', kind: 'archive' }
	},
	{
		test: (b) => ascii(b, 0, 'Rar!'),
		sniffed: { mime: 'application/vnd.rar', label: 'a RAR archive', kind: 'archive' }
	}
];

const TEXT_PROBE = 64 * 1024;

/** What the bytes are. Text means valid UTF-8 (a cut multi-byte character at the probe's end is fine) without NUL. */
export function sniff(bytes: Uint8Array): Sniffed {
	if (bytes.length === 0)
		return { mime: 'application/octet-stream', label: 'an empty file', kind: 'empty' };
	for (const s of SIGNATURES) if (s.test(bytes)) return s.sniffed;
	const head = bytes.subarray(0, TEXT_PROBE);
	if (head.includes(0))
		return { mime: 'application/octet-stream', label: 'binary data', kind: 'binary' };
	try {
		new TextDecoder('utf-8', { fatal: true }).decode(head, { stream: bytes.length > TEXT_PROBE });
		return { mime: 'text/plain', label: 'text', kind: 'text' };
	} catch {
		return { mime: 'application/octet-stream', label: 'binary data', kind: 'binary' };
	}
}

export function acceptedImage(s: Sniffed): ImageType | null {
	return ACCEPTED_IMAGES.find((t) => t === s.mime) ?? null;
}

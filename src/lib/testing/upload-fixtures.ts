// Test inputs for uploads, shared by the unit tests and the Playwright specs (no app imports).
import sharp from 'sharp';
import { crc32 } from 'node:zlib';

/** A PNG chunk: length, type, data, CRC-32 over type and data (PNG spec, 2nd ed., §5.3). */
function pngChunk(type: string, data: Buffer): Buffer {
	const len = Buffer.alloc(4);
	len.writeUInt32BE(data.length);
	const body = Buffer.concat([Buffer.from(type, 'latin1'), data]);
	const crc = Buffer.alloc(4);
	crc.writeUInt32BE(crc32(body) >>> 0);
	return Buffer.concat([len, body, crc]);
}

/**
 * A PNG whose IHDR claims width × height pixels (8-bit RGB) but whose data is a stub: enough for
 * a header read, far too little to decode. Costs a few dozen bytes whatever the size claimed.
 */
export function pngHeaderOnly(width: number, height: number): Buffer {
	const ihdr = Buffer.alloc(13);
	ihdr.writeUInt32BE(width, 0);
	ihdr.writeUInt32BE(height, 4);
	ihdr[8] = 8; // bit depth
	ihdr[9] = 2; // colour type RGB
	return Buffer.concat([
		Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
		pngChunk('IHDR', ihdr),
		pngChunk('IDAT', Buffer.from([0x78, 0x9c, 0x03, 0x00, 0x00, 0x00, 0x00, 0x01])),
		pngChunk('IEND', Buffer.alloc(0))
	]);
}

/** An invented camera position for the GPS tags (a field near a fictional club). */
const FAKE_GPS = { latitude: '51/1 28/1 3000/100', longitude: '0/1 0/1 500/100' };

/** A JPEG of width × height with EXIF orientation, camera make and a GPS position. */
export async function jpegWithGps(width: number, height: number, orientation = 1): Promise<Buffer> {
	return sharp({
		create: { width, height, channels: 3, background: { r: 180, g: 120, b: 60 } }
	})
		.composite([
			{
				input: {
					create: { width: Math.ceil(width / 2), height, channels: 3, background: '#204080' }
				},
				left: 0,
				top: 0
			}
		])
		.jpeg({ quality: 85 })
		.withMetadata({ orientation })
		.withExif({
			IFD0: { Make: 'Bandwright test camera' },
			IFD3: {
				GPSLatitudeRef: 'N',
				GPSLatitude: FAKE_GPS.latitude,
				GPSLongitudeRef: 'W',
				GPSLongitude: FAKE_GPS.longitude
			}
		})
		.toBuffer();
}

export async function solidPng(width: number, height: number): Promise<Buffer> {
	return sharp({ create: { width, height, channels: 3, background: '#3070a0' } })
		.png()
		.toBuffer();
}

/** Touchstone v1 1-port text from rows of [MHz, |S11|, angle°]. */
export function touchstone(rows: [number, number, number][], option = '# MHz S MA R 50'): string {
	return (
		['! test sweep (invented data)', option, ...rows.map((r) => r.join(' '))].join('\n') + '\n'
	);
}

/** A series RLC resonance as |S11|/angle rows, for upload tests: Z = R + jX with X = Q·R·(f/f0 − f0/f) (Q = ω0·L/R), Z0 = 50 Ω. */
export function resonanceRows(
	f0Mhz: number,
	q: number,
	r: number,
	from: number,
	to: number,
	n = 201
) {
	const rows: [number, number, number][] = [];
	for (let i = 0; i < n; i++) {
		const f = from + ((to - from) * i) / (n - 1);
		const x = q * r * (f / f0Mhz - f0Mhz / f);
		const dr = (r - 50) * (r + 50) + x * x;
		const di = x * (r + 50) - (r - 50) * x;
		const den = (r + 50) ** 2 + x * x;
		const re = dr / den;
		const im = di / den;
		rows.push([
			Number(f.toFixed(4)),
			Number(Math.hypot(re, im).toFixed(6)),
			Number(((Math.atan2(im, re) * 180) / Math.PI).toFixed(4))
		]);
	}
	return rows;
}

/**
 * Whether an EXIF block (as sharp's metadata().exif gives it: "Exif\0\0" then TIFF) has IFD0 entry
 * 0x8825, the GPS IFD pointer (EXIF 2.32, CIPA DC-008-2019 §4.6.3; TIFF 6.0 §2 for the layout).
 */
export function exifHasGps(exif: Uint8Array | undefined): boolean {
	if (!exif || exif.length < 14) return false;
	const buf = Buffer.from(exif.buffer, exif.byteOffset, exif.byteLength);
	const t = buf.subarray(0, 6).toString('latin1') === 'Exif\0\0' ? 6 : 0;
	const le = buf.subarray(t, t + 2).toString('latin1') === 'II';
	const u16 = (at: number) => (le ? buf.readUInt16LE(t + at) : buf.readUInt16BE(t + at));
	const u32 = (at: number) => (le ? buf.readUInt32LE(t + at) : buf.readUInt32BE(t + at));
	const ifd0 = u32(4);
	const n = u16(ifd0);
	for (let i = 0; i < n; i++) if (u16(ifd0 + 2 + i * 12) === 0x8825) return true;
	return false;
}

/** Text files users send must be UTF-8; a byte that is not is refused by its offset, not replaced. */

export type Utf8Result = { ok: true; text: string } | { ok: false; offset: number };

export function decodeUtf8(bytes: Uint8Array): Utf8Result {
	try {
		return {
			ok: true,
			text: new TextDecoder('utf-8', { fatal: true, ignoreBOM: true }).decode(bytes)
		};
	} catch {
		return { ok: false, offset: firstInvalidByte(bytes) };
	}
}

/**
 * The lenient decoder puts one U+FFFD where the input goes wrong and decodes everything before it
 * exactly, so the offset is the UTF-8 length of what comes before the first U+FFFD that was not
 * itself in the input (as EF BF BD).
 */
function firstInvalidByte(bytes: Uint8Array): number {
	let offset = 0;
	for (const ch of new TextDecoder('utf-8', { ignoreBOM: true }).decode(bytes)) {
		const cp = ch.codePointAt(0)!;
		if (
			cp === 0xfffd &&
			!(bytes[offset] === 0xef && bytes[offset + 1] === 0xbf && bytes[offset + 2] === 0xbd)
		) {
			return offset;
		}
		offset += cp < 0x80 ? 1 : cp < 0x800 ? 2 : cp < 0x10000 ? 3 : 4;
	}
	return offset;
}

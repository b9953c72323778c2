import { describe, expect, it } from 'vitest';
import { decodeUtf8 } from './utf8';

const bytes = (...b: number[]) => Uint8Array.from(b);
const ascii = (s: string) => [...Buffer.from(s, 'latin1')];

// Well-formed UTF-8: RFC 3629 §4 and The Unicode Standard 15.0, Table 3-7. Every case below breaks
// one of its rules at the byte whose offset (from 0) the test expects.
describe('decodeUtf8', () => {
	it('decodes well-formed text, keeping a byte-order mark and a real U+FFFD as they are', () => {
		expect(decodeUtf8(Buffer.from('Café 5.8 GHz λ/4 — 📡'))).toEqual({
			ok: true,
			text: 'Café 5.8 GHz λ/4 — 📡'
		});
		expect(decodeUtf8(bytes(0xef, 0xbb, 0xbf, 0x61))).toEqual({ ok: true, text: '\ufeffa' });
		expect(decodeUtf8(bytes(0xef, 0xbf, 0xbd))).toEqual({ ok: true, text: '\ufffd' });
		expect(decodeUtf8(bytes())).toEqual({ ok: true, text: '' });
	});

	it.each([
		['a Latin-1 é', [...ascii('Caf'), 0xe9, ...ascii(' notes')], 3],
		['a lone continuation byte', [...ascii('ab'), 0x80], 2],
		['an overlong "/" (C0 AF)', [...ascii('x'), 0xc0, 0xaf], 1],
		['an encoded surrogate (ED A0 80)', [...ascii('xy'), 0xed, 0xa0, 0x80], 2],
		['a code point above U+10FFFF (F4 90 80 80)', [0xf4, 0x90, 0x80, 0x80], 0],
		['F5, never valid', [...ascii('abc'), 0xf5], 3],
		['a sequence cut off at the end', [...ascii('ab'), 0xe2, 0x82], 2],
		['a sequence cut off before the next character', [...ascii('a'), 0xe2, 0x82, ...ascii('b')], 1],
		[
			'an invalid byte after real U+FFFD and multi-byte characters',
			[0xef, 0xbf, 0xbd, 0xce, 0xbb, 0xf0, 0x9f, 0x93, 0xa1, 0xff],
			9
		]
	])('names the offset of %s', (_, input, offset) => {
		expect(decodeUtf8(bytes(...(input as number[])))).toEqual({ ok: false, offset });
	});
});

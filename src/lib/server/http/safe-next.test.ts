import { describe, expect, it } from 'vitest';
import { safeNext } from './safe-next';

const ORIGIN = 'https://bandwright.example';

/** Where a browser goes when it follows `Location: <value>` from a page on ORIGIN. */
const followed = (location: string) => new URL(location, `${ORIGIN}/signin`);

// Known open-redirect bypasses: OWASP Unvalidated Redirects and Forwards Cheat Sheet, the WHATWG
// URL Standard (tab/newline stripping, "\" as "/" in special schemes, dot segments and %2e), and
// RFC 3986 §3.2.1 (userinfo). Each must end on our own origin, or on the fallback.
const BYPASSES = [
	'/\t/evil.example/phish',
	'/%09/evil.example',
	'/\n/evil.example',
	'/\r\n/evil.example',
	'/\r\nSet-Cookie: x=1',
	'\t//evil.example',
	' //evil.example',
	'//evil.example',
	'///evil.example',
	'////evil.example',
	'/\\evil.example',
	'\\/evil.example',
	'/\\/evil.example',
	'/%5Cevil.example',
	'/%2F/evil.example',
	'/%2f%2fevil.example',
	'/.//evil.example',
	'/./\t/evil.example',
	'/%2e//evil.example',
	'/%2E%2E//evil.example',
	'/..//evil.example',
	'/a/..//evil.example',
	'/designs/../..//evil.example',
	'//user:pass@evil.example',
	'/@evil.example',
	'https://evil.example',
	'https:evil.example',
	'http:/evil.example',
	'javascript:alert(1)',
	'data:text/html,x',
	'//evil。example',
	'/／evil.example',
	'//ｅｖｉｌ.example',
	'//xn--vil-9la.example',
	'/\u0000/evil.example',
	'/\u007f/evil.example',
	'/\u2028/evil.example',
	`/${'a'.repeat(5000)}`
];

describe('safeNext', () => {
	it.each(BYPASSES.map((b) => [JSON.stringify(b).slice(0, 40), b]))(
		'keeps %s on our own origin',
		(_, next) => {
			const out = safeNext(next, '/fallback');
			expect(followed(out).origin).toBe(ORIGIN);
			// What the server sends must be a plain path: no control characters, no "//" or "/\" start.
			expect(out).toMatch(/^\/(?![/\\])/);
			expect(out).not.toMatch(/[\u0000-\u001f\u007f\\]/);
		}
	);

	it('refuses control characters, backslashes and paths that become "//" when parsed', () => {
		for (const next of [
			'/\t/evil.example/phish',
			'/a\rb',
			'/a\nb',
			'/a\\b',
			'/.//evil.example',
			'/%2e//evil.example',
			'/..//evil.example'
		]) {
			expect(safeNext(next, '/fallback'), JSON.stringify(next)).toBe('/fallback');
		}
	});

	it('keeps ordinary same-site paths with their query and fragment; no value means the fallback', () => {
		for (const path of ['/designs/biquad-2g4?f=5.8%20GHz#rows', '/account', '/review/x/2?mine=1'])
			expect(safeNext(path)).toBe(path);
		expect(safeNext('')).toBe('/designs');
		expect(safeNext(null, '/account')).toBe('/account');
		expect(safeNext(undefined, '')).toBe('');
	});
});

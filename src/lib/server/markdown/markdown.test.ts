import { JSDOM } from 'jsdom';
import { describe, expect, it } from 'vitest';
import {
	MAX_MARKDOWN_BYTES,
	MarkdownTooLongError,
	markdownToPlainText,
	renderMarkdown,
	sanitizeHtml
} from './markdown';
import { XSS_VECTORS } from '../../testing/xss-corpus';

const FORBIDDEN_TAGS = [
	'script',
	'style',
	'form',
	'input',
	'iframe',
	'object',
	'embed',
	'base',
	'meta'
];
const BAD_URL = /^(?:javascript|vbscript|data:text\/html)/i;
const URL_WHITESPACE = /[\u0000-\u0020\u00A0\u1680\u180E\u2000-\u2029\u205F\u3000]/g;

/** Every problem found in sanitized HTML; empty means safe by these checks. */
function findProblems(html: string): string[] {
	const problems: string[] = [];
	const lower = html.toLowerCase();
	for (const tag of FORBIDDEN_TAGS) if (lower.includes(`<${tag}`)) problems.push(`<${tag}`);
	// Serialized HTML escapes '<' in text, so every '<' must open a well-formed tag.
	const tag = /<\/?[a-z][a-z0-9-]*((?:\s+[^\s"'=<>/`]+(?:="[^"]*")?)*)\s*\/?>/gi;
	const rest = html.replace(tag, (_m, attrs: string) => {
		for (const [, name] of attrs.replace(/="[^"]*"/g, '').matchAll(/\s+([^\s"'=<>/`]+)/g)) {
			if (/^on/i.test(name)) problems.push(`attribute ${name}`);
		}
		for (const [, value] of attrs.matchAll(/="([^"]*)"/g)) {
			const decoded = new JSDOM(`<p title="${value}">`).window.document.querySelector('p');
			const text = (decoded?.getAttribute('title') ?? '').replace(URL_WHITESPACE, '');
			if (BAD_URL.test(text)) problems.push(`url ${value}`);
		}
		return '';
	});
	if (rest.includes('<')) problems.push(`unparsed markup: ${rest}`);
	const doc = new JSDOM(`<body>${html}</body>`).window.document;
	for (const el of Array.from(doc.body.querySelectorAll('*'))) {
		for (const attr of Array.from(el.attributes)) {
			if (/^on/i.test(attr.name)) problems.push(`dom ${el.tagName} ${attr.name}`);
			if (BAD_URL.test(attr.value.replace(URL_WHITESPACE, '')))
				problems.push(`dom url ${attr.value}`);
		}
		if (FORBIDDEN_TAGS.includes(el.tagName.toLowerCase())) problems.push(`dom <${el.tagName}>`);
	}
	return problems;
}

describe('XSS corpus', () => {
	it('holds at least 60 vectors', () => {
		expect(XSS_VECTORS.length).toBeGreaterThanOrEqual(60);
	});

	it('the checker itself flags unsanitized vectors', () => {
		// Without this, an always-empty findProblems would pass every corpus case.
		expect(findProblems('<img src=x onerror=alert(1)>')).not.toEqual([]);
		expect(findProblems('<a href="jav&#x09;ascript:alert(1)">x</a>')).not.toEqual([]);
		expect(findProblems('<a href="data:text/html,x">x</a>')).not.toEqual([]);
		expect(findProblems('<style>p{}</style>')).not.toEqual([]);
		expect(findProblems('<p title="a onclick=x">ok</p>')).toEqual([]);
	});

	it.each(XSS_VECTORS.map((v, i) => [i, v]))('vector %i is neutralized', (_i, vector) => {
		const html = renderMarkdown(vector as string);
		expect(findProblems(html)).toEqual([]);
		// A second pass must not change the output: a change is the mark of mutation XSS.
		expect(sanitizeHtml(html)).toBe(html);
	});
});

describe('renderMarkdown: ordinary Markdown', () => {
	it('renders headings, emphasis and paragraphs', () => {
		const html = renderMarkdown('# Biquad for 2.4 GHz\n\nCut the **copper** *carefully*.');
		expect(html).toContain('<h1>Biquad for 2.4 GHz</h1>');
		expect(html).toContain('<strong>copper</strong>');
		expect(html).toContain('<em>carefully</em>');
	});

	it('renders ordered and unordered lists', () => {
		const html = renderMarkdown('1. cut\n2. bend\n\n- wire\n- reflector');
		expect(html).toMatch(/<ol>\s*<li>cut<\/li>\s*<li>bend<\/li>\s*<\/ol>/);
		expect(html).toMatch(/<ul>\s*<li>wire<\/li>\s*<li>reflector<\/li>\s*<\/ul>/);
	});

	it('keeps an ordered list start number', () => {
		expect(renderMarkdown('3. third\n4. fourth')).toContain('<ol start="3">');
	});

	it('renders GFM tables with alignment', () => {
		const html = renderMarkdown('| row | mm |\n|:---|---:|\n| L1 | 30.5 |');
		expect(html).toContain('<table>');
		expect(html).toMatch(/<th align="left">row<\/th>/);
		expect(html).toMatch(/<td align="right">30.5<\/td>/);
	});

	it('renders fenced code with its language class and escapes its content', () => {
		const html = renderMarkdown('```ts\nconst a = 1 < 2;\n```');
		expect(html).toContain('<pre><code class="language-ts">');
		expect(html).toContain('1 &lt; 2');
	});

	it('drops class attributes other than a code language', () => {
		const html = renderMarkdown('<p class="fixed inset-0">x</p>');
		expect(html).toBe('<p>x</p>');
	});

	it('gives every link rel="noopener noreferrer" and no target', () => {
		const html = renderMarkdown(
			'[guide](https://example.org/guide) and <a href="/designs" target="_blank">local</a> <https://example.net>'
		);
		const links = Array.from(new JSDOM(html).window.document.querySelectorAll('a'));
		expect(links.map((a) => a.getAttribute('href'))).toEqual([
			'https://example.org/guide',
			'/designs',
			'https://example.net'
		]);
		for (const a of links) {
			expect(a.getAttribute('rel')).toBe('noopener noreferrer');
			expect(a.hasAttribute('target')).toBe(false);
		}
	});

	it('keeps http, https, mailto, relative and anchor links', () => {
		const md =
			'[a](http://a.example) [b](https://b.example) [c](mailto:c@example.org) [d](../d) [e](#e)';
		const hrefs = Array.from(
			new JSDOM(renderMarkdown(md)).window.document.querySelectorAll('a')
		).map((a) => a.getAttribute('href'));
		expect(hrefs).toEqual([
			'http://a.example',
			'https://b.example',
			'mailto:c@example.org',
			'../d',
			'#e'
		]);
	});

	it('drops links with other schemes', () => {
		const html = renderMarkdown('[f](ftp://f.example) [t](tel:+100) [b](blob:https://x/1)');
		const a = Array.from(new JSDOM(html).window.document.querySelectorAll('a'));
		expect(a.map((x) => x.getAttribute('href'))).toEqual([null, null, null]);
	});

	it('keeps https and relative images, lazy and without referrer; drops data: images', () => {
		const html = renderMarkdown(
			'![sweep](https://img.example/s.png) ![photo](/attachments/a) ![x](data:image/png;base64,AAAA)'
		);
		const imgs = Array.from(new JSDOM(html).window.document.querySelectorAll('img'));
		expect(imgs.map((i) => i.getAttribute('src'))).toEqual([
			'https://img.example/s.png',
			'/attachments/a',
			null
		]);
		expect(imgs.map((i) => i.getAttribute('alt'))).toEqual(['sweep', 'photo', 'x']);
		for (const i of imgs) {
			expect(i.getAttribute('loading')).toBe('lazy');
			expect(i.getAttribute('referrerpolicy')).toBe('no-referrer');
		}
	});

	it('removes GFM task-list checkboxes (input is forbidden) but keeps the text', () => {
		const html = renderMarkdown('- [x] trim the driven element');
		expect(html).not.toContain('<input');
		expect(html).toContain('trim the driven element');
	});

	it('renders an empty document as an empty string', () => {
		expect(renderMarkdown('')).toBe('');
	});
});

describe('sanitizeHtml', () => {
	it('applies the same rules to ready-made HTML', () => {
		expect(sanitizeHtml('<a href="https://x.example" onclick="y()" style="color:red">x</a>')).toBe(
			'<a href="https://x.example" rel="noopener noreferrer">x</a>'
		);
	});

	it('throws a TypeError for a non-string', () => {
		expect(() => sanitizeHtml(null as unknown as string)).toThrow(TypeError);
	});
});

describe('renderMarkdown: input size', () => {
	it('accepts input of exactly the limit', () => {
		expect(() => renderMarkdown('a'.repeat(MAX_MARKDOWN_BYTES))).not.toThrow();
	});

	it('throws MarkdownTooLongError one byte over the limit, counting UTF-8 bytes', () => {
		const tooLong = 'a'.repeat(MAX_MARKDOWN_BYTES - 1) + 'é'; // é is 2 bytes in UTF-8
		expect(() => renderMarkdown(tooLong)).toThrow(MarkdownTooLongError);
		try {
			renderMarkdown(tooLong);
		} catch (e) {
			expect(e).toMatchObject({ limit: MAX_MARKDOWN_BYTES, actual: MAX_MARKDOWN_BYTES + 1 });
			expect((e as Error).message).toContain(String(MAX_MARKDOWN_BYTES));
		}
	});

	it('throws a TypeError for a non-string', () => {
		expect(() => renderMarkdown(42 as unknown as string)).toThrow(TypeError);
	});
});

describe('markdownToPlainText', () => {
	it('strips markup and separates blocks with spaces', () => {
		const text = markdownToPlainText(
			'# Helix\n\nSeven **turns** on a [tube](https://x.example).\n\n- a\n- b'
		);
		expect(text).toBe('Helix Seven turns on a tube. a b');
	});

	it('returns entity-decoded text and no script content', () => {
		expect(markdownToPlainText('AT&amp;T <script>alert(1)</script>1 < 2')).toBe('AT&T 1 < 2');
	});

	it('enforces the same size limit', () => {
		expect(() => markdownToPlainText('a'.repeat(MAX_MARKDOWN_BYTES + 1))).toThrow(
			MarkdownTooLongError
		);
	});
});

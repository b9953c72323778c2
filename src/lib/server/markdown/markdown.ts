import createDOMPurify, { type Config } from 'dompurify';
import { JSDOM } from 'jsdom';
import { Marked } from 'marked';

/** Upper bound on Markdown input, in UTF-8 bytes. Build notes run to a few kB; 200 kB is generous. */
export const MAX_MARKDOWN_BYTES = 200 * 1024;

export class MarkdownTooLongError extends Error {
	readonly limit: number;
	readonly actual: number;
	constructor(actual: number, limit = MAX_MARKDOWN_BYTES) {
		super(`Markdown text is ${actual} bytes; the limit is ${limit} bytes`);
		this.name = 'MarkdownTooLongError';
		this.limit = limit;
		this.actual = actual;
	}
}

// prettier-ignore
const ALLOWED_TAGS = [
	'a', 'abbr', 'b', 'blockquote', 'br', 'code', 'dd', 'del', 'details', 'div', 'dl', 'dt', 'em',
	'h1', 'h2', 'h3', 'h4', 'h5', 'h6', 'hr', 'i', 'img', 'kbd', 'li', 'ol', 'p', 'pre', 's', 'samp',
	'span', 'strong', 'sub', 'summary', 'sup', 'table', 'tbody', 'td', 'tfoot', 'th', 'thead', 'tr',
	'ul'
];

// Redundant with the allow-list on purpose: if someone widens ALLOWED_TAGS, these stay out.
// svg and math are out because they are where most mutation-XSS (mXSS) tricks live.
// prettier-ignore
const FORBID_TAGS = [
	'base', 'button', 'embed', 'form', 'frame', 'frameset', 'iframe', 'input', 'link', 'math',
	'meta', 'noscript', 'object', 'option', 'script', 'select', 'style', 'svg', 'template',
	'textarea'
];

const ALLOWED_ATTR = [
	'align',
	'alt',
	'class',
	'colspan',
	'href',
	'rowspan',
	'src',
	'start',
	'title'
];

// http, https and mailto, or a scheme-less (relative, anchor) reference.
const ALLOWED_URI_REGEXP = /^(?:(?:https?|mailto):|[^a-z]|[a-z+.-]+(?:[^a-z+.\-:]|$))/i;
// Same characters DOMPurify and browsers drop from URLs before reading the scheme.
const URL_WHITESPACE = /[\u0000-\u0020\u00A0\u1680\u180E\u2000-\u2029\u205F\u3000]/g;
const CODE_CLASS = /^language-[a-z0-9+#_-]{1,32}$/i;

const CONFIG: Config = {
	ALLOWED_TAGS,
	FORBID_TAGS,
	ALLOWED_ATTR,
	FORBID_ATTR: ['style'],
	ALLOWED_URI_REGEXP,
	ALLOW_DATA_ATTR: false,
	ALLOW_ARIA_ATTR: false,
	ALLOW_UNKNOWN_PROTOCOLS: false,
	SAFE_FOR_TEMPLATES: false,
	WHOLE_DOCUMENT: false
};

// One window for the process: creating a jsdom per render costs milliseconds.
const window = new JSDOM('').window;
const purify = createDOMPurify(window);

purify.addHook('afterSanitizeAttributes', (node) => {
	const tag = node.nodeName.toLowerCase();
	// class only carries the code-block language; elsewhere it could borrow page styles.
	const cls = node.getAttribute('class');
	if (cls !== null && !(tag === 'code' && CODE_CLASS.test(cls))) node.removeAttribute('class');
	if (tag === 'a') {
		node.removeAttribute('target');
		node.setAttribute('rel', 'noopener noreferrer');
	}
	if (tag === 'img') {
		// DOMPurify lets data: URIs through on img; user images are uploads, served from our origin.
		// External images are allowed here; the CSP img-src decides whether the browser loads them.
		const src = node.getAttribute('src');
		if (src !== null && !isAllowedImageSource(src)) node.removeAttribute('src');
		node.setAttribute('loading', 'lazy');
		node.setAttribute('referrerpolicy', 'no-referrer');
	}
});

/** http(s) or a relative reference; no data:, blob:, protocol-relative or other schemes. */
function isAllowedImageSource(src: string): boolean {
	const compact = src.replace(URL_WHITESPACE, '');
	if (/^https?:\/\//i.test(compact)) return true;
	if (compact.startsWith('//') || compact.startsWith('\\')) return false;
	return !/^[a-z][a-z0-9+.-]*:/i.test(compact);
}

const marked = new Marked({ gfm: true, breaks: false, async: false });

function checkInput(md: string): void {
	if (typeof md !== 'string') throw new TypeError('Markdown input must be a string');
	const bytes = Buffer.byteLength(md, 'utf8');
	if (bytes > MAX_MARKDOWN_BYTES) throw new MarkdownTooLongError(bytes);
}

/**
 * Render user Markdown to sanitized HTML. The only render path for user text.
 * @throws MarkdownTooLongError when the input exceeds MAX_MARKDOWN_BYTES
 */
export function renderMarkdown(md: string): string {
	checkInput(md);
	return sanitizeHtml(marked.parse(md, { async: false }));
}

/** Sanitize HTML that is already rendered, with the same rules as renderMarkdown. */
export function sanitizeHtml(html: string): string {
	if (typeof html !== 'string') throw new TypeError('HTML input must be a string');
	return purify.sanitize(html, CONFIG);
}

// prettier-ignore
const BLOCK = new Set([
	'BLOCKQUOTE', 'BR', 'DD', 'DETAILS', 'DIV', 'DL', 'DT', 'H1', 'H2', 'H3', 'H4', 'H5', 'H6', 'HR',
	'LI', 'OL', 'P', 'PRE', 'SUMMARY', 'TABLE', 'TD', 'TH', 'TR', 'UL'
]);

/**
 * Plain text of user Markdown for search snippets: tags dropped, whitespace collapsed.
 * The result is text, not HTML; escape it where it is output.
 * @throws MarkdownTooLongError when the input exceeds MAX_MARKDOWN_BYTES
 */
export function markdownToPlainText(md: string): string {
	const template = window.document.createElement('template');
	template.innerHTML = renderMarkdown(md);
	const parts: string[] = [];
	const walk = (node: Node): void => {
		for (const child of Array.from(node.childNodes)) {
			if (child.nodeType === window.Node.TEXT_NODE) parts.push(child.textContent ?? '');
			else if (child.nodeType === window.Node.ELEMENT_NODE) {
				const block = BLOCK.has(child.nodeName);
				if (block) parts.push(' ');
				walk(child);
				if (block) parts.push(' ');
			}
		}
	};
	walk(template.content);
	return parts.join('').replace(/\s+/g, ' ').trim();
}

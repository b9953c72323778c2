// Any origin works as the base: only whether the parsed result stays on it matters.
const BASE = 'http://next.invalid';

/**
 * Only same-site paths are followed after sign-in (no open redirects). The value is parsed by the
 * WHATWG URL parser, as a browser would resolve it, and refused when it holds a control character
 * (browsers drop tabs and newlines, and CR/LF would break the Location header) or a backslash
 * (read as "/"), when it resolves to another origin, or when its normalized path starts with "//".
 */
export function safeNext(next: string | null | undefined, fallback = '/designs'): string {
	if (
		!next ||
		next.length > 2000 ||
		!next.startsWith('/') ||
		/[\u0000-\u001f\u007f-\u009f\\]/.test(next)
	) {
		return fallback;
	}
	let url: URL;
	try {
		url = new URL(next, BASE);
	} catch {
		return fallback;
	}
	const path = url.pathname + url.search + url.hash;
	if (url.origin !== BASE || path.startsWith('//')) return fallback;
	return path;
}

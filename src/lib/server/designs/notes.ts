import type { Revision } from '../db/schema';
import { renderMarkdown } from '../markdown/markdown';
import { LRUCache } from 'lru-cache';

const cache = new LRUCache<string, string>({ max: 1000 });

/** Sanitized HTML of a revision's notes; frozen revisions are rendered once. */
export function notesHtml(r: Revision): string {
	const key = r.state === 'draft' ? `${r.id}@${r.updatedAt.getTime()}` : r.id;
	let html = cache.get(key);
	if (html === undefined) {
		html = renderMarkdown(r.notes);
		cache.set(key, html);
	}
	return html;
}

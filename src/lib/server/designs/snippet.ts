/**
 * Search-result snippets made in JavaScript from the stored text of the page's rows. FTS5's own
 * snippet() re-walks the whole match for every row (about 1 ms a row for prefix queries over
 * 10 000 designs), while the rows' text is a cheap lookup by rowid.
 *
 * Words are compared the way the index tokenizer (unicode61, remove_diacritics 2) folds them:
 * case and diacritics ignored; a query word matches any word it begins (the queries are prefixes).
 */

export interface SnippetPart {
	text: string;
	hit: boolean;
}

const WORD = /[\p{L}\p{N}_]+/gu;

/** Lower case without diacritics, as the index tokenizer folds words. */
export function foldWord(w: string): string {
	return w.normalize('NFKD').replace(/\p{M}/gu, '').toLowerCase();
}

interface Token {
	start: number;
	end: number;
	/** Index into the query words this token begins with, or -1. */
	term: number;
}

function tokens(text: string, terms: string[]): Token[] {
	const out: Token[] = [];
	for (const m of text.matchAll(WORD)) {
		const folded = foldWord(m[0]);
		out.push({
			start: m.index,
			end: m.index + m[0].length,
			term: terms.findIndex((t) => folded.startsWith(t))
		});
	}
	return out;
}

/** The window of at most `size` tokens holding the most distinct query words (earliest on ties). */
function bestWindow(toks: Token[], size: number): { from: number; score: number } {
	let best = { from: 0, score: -1 };
	for (let from = 0; from < Math.max(1, toks.length - size + 1); from++) {
		const seen = new Set<number>();
		let hits = 0;
		for (let i = from; i < Math.min(toks.length, from + size); i++) {
			if (toks[i].term < 0) continue;
			seen.add(toks[i].term);
			hits++;
		}
		const score = seen.size * 1000 + hits;
		if (score > best.score) best = { from, score };
	}
	return best;
}

/**
 * A snippet of at most `size` words from the best of `texts` (earlier texts win ties), with the
 * words that match marked; '…' where the text was cut. Null when no text has a matching word.
 */
export function makeSnippet(
	texts: string[],
	queryWords: string[],
	size = 14
): SnippetPart[] | null {
	const terms = queryWords.map(foldWord).filter(Boolean);
	let chosen: { text: string; toks: Token[]; from: number; score: number } | null = null;
	for (const text of texts) {
		const toks = tokens(text, terms);
		const w = bestWindow(toks, size);
		if (w.score >= 1000 && (!chosen || w.score > chosen.score)) chosen = { text, toks, ...w };
	}
	if (!chosen) return null;
	const { text, toks, from } = chosen;
	const shown = toks.slice(from, from + size);
	const parts: SnippetPart[] = [];
	const push = (s: string, hit: boolean) => {
		if (!s) return;
		const last = parts[parts.length - 1];
		if (last && last.hit === hit && !hit) last.text += s;
		else parts.push({ text: s, hit });
	};
	if (from > 0) push('…', false);
	let at = shown[0].start;
	for (const t of shown) {
		push(text.slice(at, t.start), false);
		push(text.slice(t.start, t.end), t.term >= 0);
		at = t.end;
	}
	if (from + size < toks.length) push('…', false);
	else push(text.slice(at), false);
	return parts;
}

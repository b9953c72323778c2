/** Word-level diff of two revisions' Markdown notes, and a line-aligned view for wide screens. */
import { diffLines, diffWordsWithSpace } from 'diff';
import type { Change } from 'diff';

type NotesOp = 'equal' | 'insert' | 'delete';
export interface NotesDiffPart {
	op: NotesOp;
	text: string;
}

export interface SideBySideRow {
	/** null: no line on this side (a filler opposite an inserted or deleted line). */
	left: NotesDiffPart[] | null;
	right: NotesDiffPart[] | null;
	leftLine: number | null;
	rightLine: number | null;
	changed: boolean;
}

export interface NotesDiffOptions {
	/** Word diff gives up after this long and falls back to a line diff (big, very different notes). */
	timeoutMs?: number;
}

const JOINER = /^[ \t]*[.,:;/-]?[ \t]*$/;

const opOf = (c: Change): NotesOp => (c.added ? 'insert' : c.removed ? 'delete' : 'equal');

/**
 * Merges runs and tidies change blocks: a space or a lone punctuation mark between two changes
 * joins both sides ("1.6" -> "0.8" reads as one change), and the deletion comes before the insertion.
 */
function tidy(parts: NotesDiffPart[]): NotesDiffPart[] {
	const out: NotesDiffPart[] = [];
	let del = '';
	let ins = '';
	const flush = () => {
		if (del) out.push({ op: 'delete', text: del });
		if (ins) out.push({ op: 'insert', text: ins });
		del = '';
		ins = '';
	};
	parts.forEach((part, i) => {
		if (part.text === '') return;
		if (part.op === 'delete') del += part.text;
		else if (part.op === 'insert') ins += part.text;
		else {
			const next = parts[i + 1];
			const between = (del || ins) && next && next.op !== 'equal' && JOINER.test(part.text);
			if (between) {
				del += part.text;
				ins += part.text;
				return;
			}
			flush();
			const last = out[out.length - 1];
			if (last?.op === 'equal') last.text += part.text;
			else out.push({ op: 'equal', text: part.text });
		}
	});
	flush();
	return out;
}

export function diffNotes(
	from: string,
	to: string,
	options: NotesDiffOptions = {}
): NotesDiffPart[] {
	const a = String(from ?? '').replace(/\r\n?/g, '\n');
	const b = String(to ?? '').replace(/\r\n?/g, '\n');
	if (a === b) return a === '' ? [] : [{ op: 'equal', text: a }];
	const words = diffWordsWithSpace(a, b, { timeout: options.timeoutMs ?? 2000 });
	const changes = words ?? diffLines(a, b);
	return tidy(changes.map((c) => ({ op: opOf(c), text: c.value })));
}

interface Line {
	parts: NotesDiffPart[];
	/** Ids of the equal runs this line holds; both sides of a block pair lines that share one. */
	shared: Set<number>;
}

const newLine = (): Line => ({ parts: [], shared: new Set() });

/** Pairs the lines of one block (between two unchanged line breaks) in order, fillers opposite. */
function alignBlock(left: Line[], right: Line[]): [Line | null, Line | null][] {
	const pairs: [Line | null, Line | null][] = [];
	let j = 0;
	const pending: Line[] = [];
	const flushUntil = (end: number) => {
		const extra = right.slice(j, end);
		const n = Math.max(pending.length, extra.length);
		for (let k = 0; k < n; k++) pairs.push([pending[k] ?? null, extra[k] ?? null]);
		pending.length = 0;
		j = end;
	};
	for (const line of left) {
		const match = right.findIndex(
			(r, k) => k >= j && [...line.shared].some((id) => r.shared.has(id))
		);
		if (match === -1) {
			pending.push(line);
			continue;
		}
		flushUntil(match);
		pairs.push([line, right[match]]);
		j = match + 1;
	}
	flushUntil(right.length);
	return pairs;
}

/** Aligns the word diff into left (old) and right (new) lines; unchanged lines share a row. */
export function sideBySide(parts: NotesDiffPart[]): SideBySideRow[] {
	const rows: SideBySideRow[] = [];
	let leftNo = 0;
	let rightNo = 0;
	let left: Line[] = [newLine()];
	let right: Line[] = [newLine()];
	let nextId = 0;

	const isChanged = (line: Line | null) => !line || line.parts.some((p) => p.op !== 'equal');
	const flush = () => {
		for (const [l, r] of alignBlock(left, right)) {
			rows.push({
				left: l ? l.parts : null,
				right: r ? r.parts : null,
				leftLine: l ? ++leftNo : null,
				rightLine: r ? ++rightNo : null,
				changed: isChanged(l) || isChanged(r)
			});
		}
		left = [newLine()];
		right = [newLine()];
	};

	for (const part of parts) {
		part.text.split('\n').forEach((text, i) => {
			if (i > 0) {
				if (part.op === 'equal') flush();
				if (part.op === 'delete') left.push(newLine());
				if (part.op === 'insert') right.push(newLine());
			}
			const id = nextId++;
			for (const side of part.op === 'equal'
				? [left, right]
				: part.op === 'delete'
					? [left]
					: [right]) {
				const line = side[side.length - 1];
				if (text === '') continue;
				const last = line.parts[line.parts.length - 1];
				if (last?.op === part.op) last.text += text;
				else line.parts.push({ op: part.op, text });
				if (part.op === 'equal') line.shared.add(id);
			}
		});
	}
	// A text that ends in a line break has no further line.
	if (left[left.length - 1].parts.length === 0) left.pop();
	if (right[right.length - 1].parts.length === 0) right.pop();
	flush();
	return rows;
}

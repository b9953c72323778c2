import { describe, expect, it } from 'vitest';
import { diffNotes, sideBySide } from './notes-diff';
import type { NotesDiffPart } from './notes-diff';

// Expected outputs follow from the inputs by reading them word by word; no external reference.
const text = (parts: NotesDiffPart[] | null) => (parts ? parts.map((p) => p.text).join('') : null);
const rebuild = (parts: NotesDiffPart[], side: 'old' | 'new') =>
	parts
		.filter((p) => p.op === 'equal' || p.op === (side === 'old' ? 'delete' : 'insert'))
		.map((p) => p.text)
		.join('');

describe('diffNotes', () => {
	it('finds a changed word and keeps the rest equal', () => {
		expect(diffNotes('Cut the arm to 30 mm.', 'Cut the arm to 31 mm.')).toEqual([
			{ op: 'equal', text: 'Cut the arm to ' },
			{ op: 'delete', text: '30' },
			{ op: 'insert', text: '31' },
			{ op: 'equal', text: ' mm.' }
		]);
	});

	it('joins neighbouring changes across a space or a decimal point', () => {
		expect(diffNotes('one two three', 'one four five three')).toEqual([
			{ op: 'equal', text: 'one ' },
			{ op: 'delete', text: 'two ' },
			{ op: 'insert', text: 'four five ' },
			{ op: 'equal', text: 'three' }
		]);
		const parts = diffNotes('Use 1.6 mm FR-4.', 'Use 0.8 mm FR-4.');
		expect(parts.filter((p) => p.op !== 'equal')).toEqual([
			{ op: 'delete', text: '1.6' },
			{ op: 'insert', text: '0.8' }
		]);
	});

	it('never leaves two neighbouring parts with the same op', () => {
		const parts = diffNotes('a b c d e f g', 'a x c y e z g h');
		for (let i = 1; i < parts.length; i++) expect(parts[i].op).not.toBe(parts[i - 1].op);
	});

	it('rebuilds both texts exactly, including Markdown line breaks', () => {
		const a = '# Build\n\n- Cut the **arm** to 30 mm\n- Solder\n';
		const b = '# Build\r\n\r\n- Cut the **arm** to 12.9 mm\r\n- Drill 3.2 mm\r\n- Solder\r\n';
		const parts = diffNotes(a, b);
		expect(rebuild(parts, 'old')).toBe(a);
		expect(rebuild(parts, 'new')).toBe(b.replace(/\r\n/g, '\n'));
	});

	it('handles empty and identical notes', () => {
		expect(diffNotes('', '')).toEqual([]);
		expect(diffNotes('same', 'same')).toEqual([{ op: 'equal', text: 'same' }]);
		expect(diffNotes('', 'new')).toEqual([{ op: 'insert', text: 'new' }]);
		expect(diffNotes('old', '')).toEqual([{ op: 'delete', text: 'old' }]);
	});
});

describe('sideBySide', () => {
	it('puts an inserted line opposite a filler', () => {
		const rows = sideBySide(diffNotes('A\nC', 'A\nB\nC'));
		expect(rows.map((r) => [text(r.left), text(r.right), r.changed])).toEqual([
			['A', 'A', false],
			[null, 'B', true],
			['C', 'C', false]
		]);
		expect(rows.map((r) => [r.leftLine, r.rightLine])).toEqual([
			[1, 1],
			[null, 2],
			[2, 3]
		]);
	});

	it('puts a deleted line opposite a filler', () => {
		const rows = sideBySide(diffNotes('A\nB\nC\n', 'A\nC\n'));
		expect(rows.map((r) => [text(r.left), text(r.right)])).toEqual([
			['A', 'A'],
			['B', null],
			['C', 'C']
		]);
	});

	it('pairs a changed line with its new version and marks the words', () => {
		const rows = sideBySide(diffNotes('A\nX marks\nC', 'A\nY marks\nC'));
		expect(rows).toHaveLength(3);
		expect(rows[1].left).toEqual([
			{ op: 'delete', text: 'X' },
			{ op: 'equal', text: ' marks' }
		]);
		expect(rows[1].right).toEqual([
			{ op: 'insert', text: 'Y' },
			{ op: 'equal', text: ' marks' }
		]);
		expect(rows[1].changed).toBe(true);
	});

	it('keeps blank lines between paragraphs aligned', () => {
		const rows = sideBySide(diffNotes('P1\n\nP2\n', 'P1\n\nNew\n\nP2\n'));
		expect(rows.map((r) => [text(r.left), text(r.right)])).toEqual([
			['P1', 'P1'],
			['', ''],
			[null, 'New'],
			[null, ''],
			['P2', 'P2']
		]);
	});

	it('a line added at the end without a final newline', () => {
		const rows = sideBySide(diffNotes('A', 'A\nB'));
		expect(rows.map((r) => [text(r.left), text(r.right)])).toEqual([
			['A', 'A'],
			[null, 'B']
		]);
	});
});

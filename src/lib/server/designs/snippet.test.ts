import { describe, expect, it } from 'vitest';
import { foldWord, makeSnippet, type SnippetPart } from './snippet';

const hits = (parts: SnippetPart[] | null) => (parts ?? []).filter((p) => p.hit).map((p) => p.text);
const plain = (parts: SnippetPart[] | null) => (parts ?? []).map((p) => p.text).join('');

describe('makeSnippet', () => {
	it('marks words that begin with a query word, ignoring case and diacritics', () => {
		const parts = makeSnippet(['Solder the Réflecteur, then SOLDERING tags.'], ['refl', 'solder']);
		expect(hits(parts)).toEqual(['Solder', 'Réflecteur', 'SOLDERING']);
		expect(plain(parts)).toBe('Solder the Réflecteur, then SOLDERING tags.');
		expect(foldWord('Réflecteur')).toBe('reflecteur');
	});

	it('cuts long text around the window with the most distinct query words, with ellipses', () => {
		const filler = Array.from({ length: 30 }, (_, i) => `w${i}`).join(' ');
		const text = `copper ${filler} copper balun choke here ${filler} end`;
		const parts = makeSnippet([text], ['copper', 'balun', 'choke'], 6);
		expect(hits(parts)).toEqual(['copper', 'balun', 'choke']);
		expect(plain(parts)).toMatch(/^….*…$/);
		expect(
			plain(parts)
				.split(/\s+/)
				.filter((w) => /\w/.test(w))
		).toHaveLength(6);
	});

	it('prefers the first text on a tie and falls back to later texts', () => {
		expect(plain(makeSnippet(['notes mention helix', 'helix title'], ['helix']))).toBe(
			'notes mention helix'
		);
		expect(plain(makeSnippet(['nothing here', 'A helix antenna'], ['helix']))).toBe(
			'A helix antenna'
		);
	});

	it('is null when no word matches, and never matches inside a word', () => {
		expect(makeSnippet(['a dipole for 2 m'], ['pole'])).toBeNull();
		expect(makeSnippet([''], ['x'])).toBeNull();
		expect(makeSnippet(['text'], [])).toBeNull();
	});
});

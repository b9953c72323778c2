import { describe, expect, it } from 'vitest';
import { parseViewState } from './view-state';

// Invented revision: designed at 2.45 GHz, claiming 2.40–2.50 GHz.
const r = { designHz: 2.45e9, claimLoHz: 2.4e9, claimHiHz: 2.5e9 };
const parse = (q: string) => parseViewState(new URLSearchParams(q), r);

describe('parseViewState', () => {
	it('defaults to the design frequency, mm and the claimed band', () => {
		expect(parse('')).toEqual({
			view: { frequencyHz: 2.45e9, units: 'mm', bandId: null, band: [2.4e9, 2.5e9] },
			problems: [],
			notice: undefined
		});
	});

	it('reads f as text with a unit, units and a preset (ITU RR 5.150: 5725–5875 MHz)', () => {
		const { view, problems } = parse('f=5.8%20GHz&units=in_frac&band=ism-5g8');
		expect(problems).toEqual([]);
		expect(view).toEqual({
			frequencyHz: 5.8e9,
			units: 'in_frac',
			bandId: 'ism-5g8',
			band: [5.725e9, 5.875e9]
		});
	});

	it('has no band away from the design frequency without a preset', () => {
		expect(parse('f=5.8e9').view.band).toBeUndefined();
	});

	it('moves f to the preset centre when f lies outside the preset (a form sent without JavaScript)', () => {
		expect(parse('f=2.45e9&band=ism-5g8').view.frequencyHz).toBe(5.8e9);
	});

	it('names every problem with its field, and gives the page one notice', () => {
		const bad = parse('f=abc&units=cubits&band=nowhere');
		expect(bad.problems.map((p) => p.field)).toEqual(['f', 'units', 'band']);
		expect(bad.problems[1].message).toBe('units must be mm, in or in_frac.');
		expect(bad.problems[2].message).toBe('Unknown band preset.');
		expect(bad.view).toEqual({
			frequencyHz: 2.45e9,
			units: 'mm',
			bandId: null,
			band: [2.4e9, 2.5e9]
		});
		expect(bad.notice).toMatch(/^Frequency "abc" ignored: .* Showing 2\.45 GHz\.$/);
		expect(parse('band=nowhere').notice).toBe('Unknown band preset ignored.');
	});
});

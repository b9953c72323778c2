import { describe, expect, it } from 'vitest';
import { createDesign, starterContent } from './designs';
import { saveDraft, submitRevision } from './revisions';
import { getRevisionById } from './lookups';
import {
	assertCompilable,
	assertFormulasCompile,
	tableForView,
	tableForViewJson
} from './dimensions';
import type { ViewState } from '$lib/rf/units/view-state';
import { member } from '../../testing/server-setup';

const C = 299_792_458; // m/s, exact (SI definition of the metre)

const view = (frequencyHz: number, more: Partial<ViewState> = {}): ViewState => ({
	frequencyHz,
	units: 'mm',
	bandId: null,
	band: undefined,
	...more
});

describe('tableForViewJson', () => {
	it('answers for a submitted revision as tableForView does, per frequency, units and band', async () => {
		const author = await member('dims-json@example.org');
		const { revisionId } = createDesign(
			author,
			{ title: 'Kept answers', family: 'biquad', polarization: 'linear', summary: '' },
			starterContent(2.45e9)
		);
		submitRevision(author, revisionId);
		const r = getRevisionById(revisionId)!;
		const views = [
			view(5.8e9),
			view(5.8e9),
			view(2.45e9, { units: 'in' }),
			view(2.45e9, { band: [2.4e9, 2.5e9] })
		];
		for (const v of views) expect(tableForViewJson(r, v)).toBe(JSON.stringify(tableForView(r, v)));
		// [calc] λ/4 at 5.8 GHz = 299792458 / 5.8e9 / 4 = 12.922 mm
		const at58 = JSON.parse(tableForViewJson(r, view(5.8e9)));
		expect(at58.rows[0].value_mm).toBeCloseTo((C / 5.8e9 / 4) * 1000, 6);
		const at245 = JSON.parse(tableForViewJson(r, view(2.45e9)));
		expect(at245.rows[0].value_mm).toBeCloseTo((C / 2.45e9 / 4) * 1000, 6);
		const inches = JSON.parse(tableForViewJson(r, view(2.45e9, { units: 'in' })));
		expect(inches.rows[0].display).toMatch(/in$/);
	});

	it('computes a draft every time, so a saved change shows at once', async () => {
		const author = await member('dims-draft@example.org');
		const content = starterContent(2.45e9);
		const { revisionId } = createDesign(
			author,
			{ title: 'Draft answers', family: 'biquad', polarization: 'linear', summary: '' },
			content
		);
		const before = JSON.parse(tableForViewJson(getRevisionById(revisionId)!, view(2.45e9)));
		saveDraft(author, revisionId, {
			...content,
			rows: [{ ...content.rows[0], formula: 'lambda / 2' }]
		});
		const after = JSON.parse(tableForViewJson(getRevisionById(revisionId)!, view(2.45e9)));
		// [calc] λ/2 = 2 × λ/4
		expect(after.rows[0].value_mm).toBeCloseTo(2 * before.rows[0].value_mm, 9);
	});
});

describe('assertFormulasCompile (design file import)', () => {
	const withRows = (rows: { key: string; formula: string; kind: 'resonant' | 'structural' }[]) => ({
		...starterContent(5.8e9),
		rows: rows.map((r) => ({ ...r, label: r.key }))
	});

	it('names the first row the editor would mark, at its root rather than the rows that use it', () => {
		const content = withRows([
			{ key: 'side', formula: 'lambda / 4', kind: 'resonant' },
			{ key: 'gap', formula: 'side * nowhere', kind: 'structural' },
			{ key: 'twice', formula: 'gap * 2', kind: 'structural' }
		]);
		// The save check lets a draft keep it; the import check does not.
		expect(() => assertCompilable(content)).not.toThrow();
		expect(() => assertFormulasCompile(content)).toThrow(/^Row 2 "gap" \(rows\[1\]\): .*nowhere/);
	});

	it('refuses a dimension the editor refuses, and accepts a table that compiles', () => {
		expect(() =>
			assertFormulasCompile(withRows([{ key: 'bad', formula: '5.8 GHz', kind: 'resonant' }]))
		).toThrow(/^Row 1 "bad" \(rows\[0\]\): a resonant row must give/);
		expect(() =>
			assertFormulasCompile(withRows([{ key: 'side', formula: 'lambda / 4', kind: 'resonant' }]))
		).not.toThrow();
	});
});

import { describe, expect, it } from 'vitest';
import {
	contentToEditor,
	editorEvaluateRequest,
	editorFromForm,
	editorToContent
} from './editor-state';
import { editorFormSchema } from './schemas/editor';
import { readForm } from './server/http/actions';
import type { RevisionContent } from './schemas/design';

const content: RevisionContent = {
	design_frequency_hz: 2.45e9,
	parameters: [
		{ key: 'er', label: 'Substrate permittivity', value: 4.3 },
		{ key: 'h', label: 'Height', value: 1.6, unit: 'mm', valid_ratio: [0.005, 0.02] }
	],
	rows: [
		{ key: 'side', label: 'Side', formula: 'lambda / 4', kind: 'resonant', tolerance_mm: 0.2 }
	],
	claim: { centre_hz: 2.45e9, band_lo_hz: 2.4e9, band_hi_hz: 2.5e9, vswr_max: 2 },
	notes: 'Notes',
	change_note: 'First'
};

function form(entries: [string, string][]) {
	const f = new FormData();
	for (const [k, v] of entries) f.append(k, v);
	return f;
}

describe('editor state', () => {
	it('round-trips content through the editor text', () => {
		const back = editorToContent(contentToEditor(content));
		expect(back).toEqual({ ok: true, content });
	});

	it('reads repeated form fields per row and skips blank rows', async () => {
		const posted = await readForm(
			form([
				['design_frequency', '5.8 GHz'],
				['claim_centre', '5.8 GHz'],
				['claim_lo', '5725 MHz'],
				['claim_hi', '5875 MHz'],
				['claim_vswr', '2'],
				['r_key', 'side'],
				['r_label', 'Side'],
				['r_formula', 'lambda/4'],
				['r_kind', 'resonant'],
				['r_catalogue', ''],
				['r_tolerance', '0,1'],
				['r_ratio_lo', ''],
				['r_ratio_hi', ''],
				['r_key', ''],
				['r_label', ''],
				['r_formula', ''],
				['r_kind', 'resonant'],
				['r_catalogue', ''],
				['r_tolerance', ''],
				['r_ratio_lo', ''],
				['r_ratio_hi', ''],
				['notes', 'a\r\nb'],
				['change_note', '']
			]),
			editorFormSchema
		);
		const e = editorFromForm(posted.data);
		const out = editorToContent(e);
		expect(out.ok).toBe(true);
		if (!out.ok) return;
		expect(out.content.design_frequency_hz).toBe(5.8e9);
		expect(out.content.rows).toEqual([
			{ key: 'side', label: 'Side', formula: 'lambda/4', kind: 'resonant', tolerance_mm: 0.1 }
		]);
		expect(out.content.notes).toBe('a\nb');
	});

	it('names the field of every problem and keeps going', () => {
		const e = contentToEditor(content);
		e.design_frequency = 'abc';
		e.rows[0].key = 'Bad Key';
		e.rows[0].tolerance = 'wide';
		e.claim.lo = '2.6 GHz';
		e.rows.push({ ...e.rows[0], key: 'x', formula: 'y'.repeat(501) });
		const out = editorToContent(e);
		expect(out.ok).toBe(false);
		if (out.ok) return;
		expect(Object.keys(out.errors).sort()).toEqual(
			[
				'claim.band_hi_hz',
				'design_frequency_hz',
				'rows[0].key',
				'rows[0].tolerance_mm',
				'rows[1].formula',
				'rows[1].tolerance_mm'
			].sort()
		);
		expect(out.errors['rows[1].formula']).toMatch(/500/);
	});

	it('builds an evaluate request with units joined to values', () => {
		const req = editorEvaluateRequest(contentToEditor(content), 5.8e9);
		expect(req.frequency_hz).toBe(5.8e9);
		expect(req.parameters).toEqual([
			{ key: 'er', label: 'Substrate permittivity', value: 4.3 },
			{ key: 'h', label: 'Height', value: '1.6 mm' }
		]);
		expect(req.rows[0]).toMatchObject({ key: 'side', formula: 'lambda / 4', tolerance_mm: 0.2 });
	});
});

/**
 * The draft editor's form as posted: one input per cell, names repeated per row, so it works
 * without JavaScript. Everything stays text here; editorToContent checks the values.
 */
import { z } from '../zod';

const cells = z.array(z.string()).default([]);
const text = z.string().default('');

export const editorFormSchema = z.object({
	design_frequency: text,
	p_key: cells,
	p_label: cells,
	p_value: cells,
	p_unit: cells,
	p_ratio_lo: cells,
	p_ratio_hi: cells,
	r_key: cells,
	r_label: cells,
	r_formula: cells,
	r_kind: cells,
	r_catalogue: cells,
	r_tolerance: cells,
	r_ratio_lo: cells,
	r_ratio_hi: cells,
	claim_centre: text,
	claim_lo: text,
	claim_hi: text,
	claim_vswr: text,
	claim_gain: text,
	claim_gain_verified: z.boolean().default(false),
	notes: text,
	change_note: text
});

export type EditorForm = z.infer<typeof editorFormSchema>;

/**
 * The draft editor works on text: every cell is a string, exactly as typed, so a form that fails
 * validation comes back with what the author entered. These functions convert to and from content.
 */
import { formatFrequency, parseFrequency } from './rf/units/frequency';
import { revisionContentSchema, type RevisionContent, type RowKindValue } from './schemas/design';
import type { EditorForm } from './schemas/editor';

export interface EditorParameter {
	key: string;
	label: string;
	value: string;
	unit: string;
	ratio_lo: string;
	ratio_hi: string;
}
export interface EditorRow {
	key: string;
	label: string;
	formula: string;
	kind: RowKindValue;
	catalogue: string;
	tolerance: string;
	ratio_lo: string;
	ratio_hi: string;
}
export interface EditorState {
	design_frequency: string;
	parameters: EditorParameter[];
	rows: EditorRow[];
	claim: {
		centre: string;
		lo: string;
		hi: string;
		vswr: string;
		gain: string;
		gain_verified: boolean;
	};
	notes: string;
	change_note: string;
}
export type EditorErrors = Record<string, string>;

const MAX_FORM_ROWS = 400;
const s = (v: number | undefined) => (v === undefined ? '' : String(v));

export function contentToEditor(c: RevisionContent): EditorState {
	return {
		design_frequency: formatFrequency(c.design_frequency_hz),
		parameters: c.parameters.map((p) => ({
			key: p.key,
			label: p.label,
			value: String(p.value),
			unit: p.unit ?? '',
			ratio_lo: s(p.valid_ratio?.[0]),
			ratio_hi: s(p.valid_ratio?.[1])
		})),
		rows: c.rows.map((r) => ({
			key: r.key,
			label: r.label,
			formula: r.formula,
			kind: r.kind,
			catalogue: r.catalogue ?? '',
			tolerance: s(r.tolerance_mm),
			ratio_lo: s(r.valid_ratio?.[0]),
			ratio_hi: s(r.valid_ratio?.[1])
		})),
		claim: {
			centre: formatFrequency(c.claim.centre_hz),
			lo: formatFrequency(c.claim.band_lo_hz),
			hi: formatFrequency(c.claim.band_hi_hz),
			vswr: String(c.claim.vswr_max),
			gain: s(c.claim.gain_dbi),
			gain_verified: c.claim.gain_verified ?? false
		},
		notes: c.notes,
		change_note: c.change_note
	};
}

/** The editor's state from its posted form (see editorFormSchema); rows past MAX_FORM_ROWS are dropped. */
export function editorFromForm(f: EditorForm): EditorState {
	const all = (cells: string[]) => cells.slice(0, MAX_FORM_ROWS);
	const p = {
		key: all(f.p_key),
		label: f.p_label,
		value: f.p_value,
		unit: f.p_unit,
		lo: f.p_ratio_lo,
		hi: f.p_ratio_hi
	};
	const r = {
		key: all(f.r_key),
		label: f.r_label,
		formula: f.r_formula,
		kind: f.r_kind,
		catalogue: f.r_catalogue,
		tolerance: f.r_tolerance,
		lo: f.r_ratio_lo,
		hi: f.r_ratio_hi
	};
	return {
		design_frequency: f.design_frequency,
		parameters: p.key.map((key, i) => ({
			key,
			label: p.label[i] ?? '',
			value: p.value[i] ?? '',
			unit: p.unit[i] ?? '',
			ratio_lo: p.lo[i] ?? '',
			ratio_hi: p.hi[i] ?? ''
		})),
		rows: r.key.map((key, i) => ({
			key,
			label: r.label[i] ?? '',
			formula: r.formula[i] ?? '',
			kind: (r.kind[i] || 'resonant') as RowKindValue,
			catalogue: r.catalogue[i] ?? '',
			tolerance: r.tolerance[i] ?? '',
			ratio_lo: r.lo[i] ?? '',
			ratio_hi: r.hi[i] ?? ''
		})),
		claim: {
			centre: f.claim_centre,
			lo: f.claim_lo,
			hi: f.claim_hi,
			vswr: f.claim_vswr,
			gain: f.claim_gain,
			gain_verified: f.claim_gain_verified
		},
		notes: f.notes.replace(/\r\n/g, '\n'),
		change_note: f.change_note
	};
}

function num(text: string): number | undefined {
	const t = text.trim().replace(',', '.');
	if (t === '') return undefined;
	const n = Number(t);
	return Number.isFinite(n) ? n : NaN;
}

const blank = (o: object) =>
	Object.values(o).every((v) => v === '' || v === 'resonant' || v === false);
const defined = <T extends object>(o: T) =>
	Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined));
const ratio = (lo: string, hi: string): [number, number] | undefined =>
	lo.trim() === '' && hi.trim() === '' ? undefined : [num(lo) ?? NaN, num(hi) ?? NaN];

/** Validates the editor's text against the revision schema; errors are keyed by field path. */
export function editorToContent(
	e: EditorState
): { ok: true; content: RevisionContent } | { ok: false; errors: EditorErrors } {
	const errors: EditorErrors = {};
	const freq = (text: string, field: string) => {
		const parsed = parseFrequency(text);
		if (parsed.ok) return parsed.hz;
		errors[field] = parsed.message;
		return NaN;
	};
	const gain = num(e.claim.gain);
	const content = {
		design_frequency_hz: freq(e.design_frequency, 'design_frequency_hz'),
		parameters: e.parameters
			.filter((p) => !blank(p))
			.map((p) =>
				defined({
					key: p.key.trim(),
					label: p.label.trim(),
					value: num(p.value) ?? NaN,
					unit: p.unit.trim() || undefined,
					valid_ratio: ratio(p.ratio_lo, p.ratio_hi)
				})
			),
		rows: e.rows
			.filter((r) => !blank(r))
			.map((r) =>
				defined({
					key: r.key.trim(),
					label: r.label.trim(),
					formula: r.formula.trim(),
					kind: r.kind,
					catalogue: r.catalogue.trim() || undefined,
					tolerance_mm: num(r.tolerance),
					valid_ratio: ratio(r.ratio_lo, r.ratio_hi)
				})
			),
		claim: {
			centre_hz: freq(e.claim.centre, 'claim.centre_hz'),
			band_lo_hz: freq(e.claim.lo, 'claim.band_lo_hz'),
			band_hi_hz: freq(e.claim.hi, 'claim.band_hi_hz'),
			vswr_max: num(e.claim.vswr) ?? NaN,
			...(gain !== undefined ? { gain_dbi: gain, gain_verified: e.claim.gain_verified } : {})
		},
		notes: e.notes,
		change_note: e.change_note
	};
	const parsed = revisionContentSchema.safeParse(content);
	if (!parsed.success) {
		for (const issue of parsed.error.issues) {
			const path = issue.path.reduce<string>(
				(out, part) =>
					typeof part === 'number'
						? `${out}[${part}]`
						: out
							? `${out}.${String(part)}`
							: String(part),
				''
			);
			errors[path] ??= issue.message;
		}
	}
	return parsed.success && Object.keys(errors).length === 0
		? { ok: true, content: parsed.data }
		: { ok: false, errors };
}

/** The evaluate API's request for the editor's current text (rows that cannot be sent are left out). */
export function editorEvaluateRequest(e: EditorState, frequencyHz: number) {
	return {
		frequency_hz: frequencyHz,
		parameters: e.parameters
			.filter((p) => p.key.trim())
			.map((p) => ({
				key: p.key.trim(),
				label: p.label,
				value: p.unit.trim() ? `${p.value} ${p.unit.trim()}` : (num(p.value) ?? p.value)
			})),
		rows: e.rows
			.filter((r) => r.key.trim() && r.formula.trim())
			.map((r) => {
				const tol = num(r.tolerance);
				return defined({
					key: r.key.trim(),
					label: r.label,
					formula: r.formula,
					kind: r.kind,
					catalogue: r.catalogue.trim() || undefined,
					tolerance_mm: tol !== undefined && tol > 0 ? tol : undefined
				});
			})
	};
}

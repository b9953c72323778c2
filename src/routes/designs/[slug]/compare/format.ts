/** Number formatting for diff views (display only). */
export const mm = (v: number | null | undefined) =>
	v === null || v === undefined ? '—' : `${v.toFixed(2)} mm`;

export const signedMm = (v: number | null) =>
	v === null ? '—' : `${v > 0 ? '+' : v < 0 ? '−' : '±'}${Math.abs(v).toFixed(2)} mm`;

export const signedPct = (v: number | null) =>
	v === null
		? '—'
		: `${v > 0 ? '+' : v < 0 ? '−' : '±'}${Math.abs(v) >= 10 ? Math.abs(v).toFixed(1) : Math.abs(v).toFixed(2)} %`;

export const CHANGE_LABELS: Record<string, string> = {
	added: 'added',
	removed: 'removed',
	formula: 'formula changed',
	kind: 'kind changed',
	catalogue: 'catalogue changed',
	unit: 'unit changed',
	tolerance: 'tolerance changed',
	value: 'value changed',
	label: 'label changed',
	moved: 'moved',
	unchanged: 'unchanged'
};

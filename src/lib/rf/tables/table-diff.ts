/** Row-by-row diff of two revisions' dimension tables, parameters and claims, matched by key. */

type RowKind = 'resonant' | 'structural' | 'material' | 'count';

export interface DiffParameter {
	key: string;
	value: number | string;
	unit?: string;
	label?: string;
}

export interface DiffRow {
	key: string;
	label: string;
	formula: string;
	kind: RowKind;
	catalogue?: string;
	tolerance_mm?: number;
	unit?: string;
}

export type DiffClaim = Record<string, number | string | boolean | null | undefined>;

export interface TableSide {
	parameters: DiffParameter[];
	rows: DiffRow[];
	claim: DiffClaim;
}

/** Ordered by how much each matters to a builder; the first that applies is the primary change. */
const ROW_CHANGES = [
	'added',
	'removed',
	'formula',
	'kind',
	'catalogue',
	'unit',
	'tolerance',
	'value',
	'label',
	'moved'
] as const;
type RowChange = (typeof ROW_CHANGES)[number];

export interface RowDiff {
	key: string;
	change: RowChange | 'unchanged';
	changes: RowChange[];
	from?: DiffRow;
	to?: DiffRow;
	value_from_mm: number | null;
	value_to_mm: number | null;
	delta_mm: number | null;
	delta_pct: number | null;
	exceeds_tolerance: boolean;
	position_from: number | null;
	position_to: number | null;
}

export interface FieldDiff<T> {
	key: string;
	from?: T;
	to?: T;
	change: 'added' | 'removed' | 'changed' | 'unchanged';
}

export interface TableDiff {
	rows: RowDiff[];
	parameters: FieldDiff<DiffParameter>[];
	claims: FieldDiff<number | string | boolean | null>[];
	summary: { added: number; removed: number; changed: number; moved: number; unchanged: number };
}

export interface TableDiffValues {
	valuesFrom?: Record<string, number | null | undefined>;
	valuesTo?: Record<string, number | null | undefined>;
}

/** Values closer than this are the same length (well below any build tolerance). */
const SAME_MM = 1e-6;

/** Whitespace-only edits ("lambda/4" vs "lambda / 4") are not formula changes. */
export function normalizeFormula(formula: string): string {
	return formula
		.trim()
		.replace(/\s+/g, ' ')
		.replace(/ ?([-+*/^%(),=<>!:?]) ?/g, '$1');
}

/** Keys of the longest common subsequence of two key orders: the rows that kept their relative order. */
function stableKeys(a: string[], b: string[]): Set<string> {
	const n = a.length;
	const m = b.length;
	const lcs: number[][] = Array.from({ length: n + 1 }, () => new Array<number>(m + 1).fill(0));
	for (let i = n - 1; i >= 0; i--) {
		for (let j = m - 1; j >= 0; j--) {
			lcs[i][j] = a[i] === b[j] ? lcs[i + 1][j + 1] + 1 : Math.max(lcs[i + 1][j], lcs[i][j + 1]);
		}
	}
	const keep = new Set<string>();
	let i = 0;
	let j = 0;
	while (i < n && j < m) {
		if (a[i] === b[j]) {
			keep.add(a[i]);
			i++;
			j++;
		} else if (lcs[i + 1][j] >= lcs[i][j + 1]) i++;
		else j++;
	}
	return keep;
}

function finite(value: number | null | undefined): number | null {
	return typeof value === 'number' && Number.isFinite(value) ? value : null;
}

function rowChanges(
	from: DiffRow,
	to: DiffRow,
	moved: boolean,
	valueChanged: boolean
): RowChange[] {
	const found = new Set<RowChange>();
	if (normalizeFormula(from.formula) !== normalizeFormula(to.formula)) found.add('formula');
	if (from.kind !== to.kind) found.add('kind');
	if ((from.catalogue ?? '') !== (to.catalogue ?? '')) found.add('catalogue');
	if ((from.unit ?? '') !== (to.unit ?? '')) found.add('unit');
	if ((from.tolerance_mm ?? null) !== (to.tolerance_mm ?? null)) found.add('tolerance');
	if (valueChanged) found.add('value');
	if (from.label.trim() !== to.label.trim()) found.add('label');
	if (moved) found.add('moved');
	return ROW_CHANGES.filter((c) => found.has(c));
}

export function diffRows(from: DiffRow[], to: DiffRow[], values: TableDiffValues = {}): RowDiff[] {
	const fromIndex = new Map(from.map((row, i) => [row.key, i]));
	const toIndex = new Map(to.map((row, i) => [row.key, i]));
	const common = (rows: DiffRow[], other: Map<string, number>) =>
		rows.map((r) => r.key).filter((k) => other.has(k));
	const stable = stableKeys(common(from, toIndex), common(to, fromIndex));

	const build = (key: string): RowDiff => {
		const pf = fromIndex.get(key);
		const pt = toIndex.get(key);
		const rowFrom = pf === undefined ? undefined : from[pf];
		const rowTo = pt === undefined ? undefined : to[pt];
		const vf = rowFrom ? finite(values.valuesFrom?.[key]) : null;
		const vt = rowTo ? finite(values.valuesTo?.[key]) : null;
		const delta = vf !== null && vt !== null ? vt - vf : null;
		const pct = delta !== null && vf !== null && vf !== 0 ? (delta / Math.abs(vf)) * 100 : null;
		const tolerance = rowTo?.tolerance_mm ?? rowFrom?.tolerance_mm;
		let changes: RowChange[];
		if (!rowFrom) changes = ['added'];
		else if (!rowTo) changes = ['removed'];
		else {
			const valueChanged = delta !== null && Math.abs(delta) > SAME_MM;
			changes = rowChanges(rowFrom, rowTo, !stable.has(key), valueChanged);
		}
		return {
			key,
			change: changes[0] ?? 'unchanged',
			changes,
			from: rowFrom,
			to: rowTo,
			value_from_mm: vf,
			value_to_mm: vt,
			delta_mm: delta,
			delta_pct: pct,
			exceeds_tolerance:
				delta !== null && tolerance !== undefined && Math.abs(delta) > tolerance + SAME_MM,
			position_from: pf ?? null,
			position_to: pt ?? null
		};
	};

	// Show rows in the new order; a removed row sits after the new row that followed it before.
	const result = to.map((row) => build(row.key));
	from.forEach((row, i) => {
		if (toIndex.has(row.key)) return;
		const anchor = from
			.slice(0, i)
			.reverse()
			.find((r) => toIndex.has(r.key));
		const at = anchor ? result.findIndex((d) => d.key === anchor.key) + 1 : 0;
		let insertAt = at;
		while (insertAt < result.length && result[insertAt].change === 'removed') insertAt++;
		result.splice(insertAt, 0, build(row.key));
	});
	return result;
}

function fieldDiff<T>(
	key: string,
	from: T | undefined,
	to: T | undefined,
	same: (a: T, b: T) => boolean
): FieldDiff<T> {
	const change: FieldDiff<T>['change'] =
		from === undefined
			? 'added'
			: to === undefined
				? 'removed'
				: same(from, to)
					? 'unchanged'
					: 'changed';
	return { key, from, to, change };
}

export function diffParameters(
	from: DiffParameter[],
	to: DiffParameter[]
): FieldDiff<DiffParameter>[] {
	const before = new Map(from.map((p) => [p.key, p]));
	const after = new Map(to.map((p) => [p.key, p]));
	const keys = [...new Set([...to.map((p) => p.key), ...from.map((p) => p.key)])];
	const same = (a: DiffParameter, b: DiffParameter) =>
		a.value === b.value && (a.unit ?? '') === (b.unit ?? '') && (a.label ?? '') === (b.label ?? '');
	return keys.map((key) => fieldDiff(key, before.get(key), after.get(key), same));
}

const CLAIM_ORDER = [
	'centre_hz',
	'band_lo_hz',
	'band_hi_hz',
	'vswr_max',
	'gain_dbi',
	'gain_verified'
];

export function diffClaims(
	from: DiffClaim,
	to: DiffClaim
): FieldDiff<number | string | boolean | null>[] {
	const present = (claim: DiffClaim) => Object.keys(claim).filter((k) => claim[k] !== undefined);
	const keys = [...new Set([...CLAIM_ORDER, ...present(from), ...present(to)])];
	return keys
		.map((key) => fieldDiff(key, from[key] ?? undefined, to[key] ?? undefined, Object.is))
		.filter((d) => d.from !== undefined || d.to !== undefined);
}

export function diffTables(
	from: TableSide,
	to: TableSide,
	values: TableDiffValues = {}
): TableDiff {
	const rows = diffRows(from.rows, to.rows, values);
	const count = (test: (d: RowDiff) => boolean) => rows.filter(test).length;
	return {
		rows,
		parameters: diffParameters(from.parameters, to.parameters),
		claims: diffClaims(from.claim, to.claim),
		summary: {
			added: count((d) => d.change === 'added'),
			removed: count((d) => d.change === 'removed'),
			moved: count((d) => d.changes.includes('moved')),
			unchanged: count((d) => d.change === 'unchanged'),
			changed: count((d) => !['added', 'removed', 'unchanged', 'moved'].includes(d.change))
		}
	};
}

/**
 * The dimension engine's entry points: compileTable (once per definition; formulas are parsed once
 * per text, LRU-cached) and evaluateTable (per frequency, plain numbers only), plus computeTable.
 *
 * Decisions: a row with a catalogue (or snap) passes its stock value to later rows, since that is
 * what gets built, while its own `value` shows the exact figure and `stock` the choice. Count rows
 * pass the rounded integer. Parameters are reported in `parameters` with their own errors.
 */
import { snapToStock } from '../catalogues/stock';
import { C, DEG } from '../units/constants';
import { formatFrequency, MAX_FREQUENCY_HZ } from '../units/frequency';
import { ANGLE, FREQUENCY, LENGTH, isDimless, sameDims, siUnit, type Dims } from '../formulas/dims';
import { FormulaRuntimeError } from '../formulas/functions';
import { formatLength, lengthIn, type Units } from '../units/length';
import { resonanceShiftHz, sensitivityFor } from './sensitivity';
import type { LocatedError } from '../formulas/formula';
import {
	compileTable,
	type CompiledParameter,
	type CompiledRatio,
	type CompiledRow,
	type CompiledTable
} from './compile';
import {
	TableInputError,
	type EvaluateOptions,
	type ParameterResult,
	type RowResult,
	type TableDefinition,
	type TableResult
} from './types';

export * from './types';
export { compileTable, type CompiledTable } from './compile';

const NUMBER = (v: number) => String(Number(v.toPrecision(6)));

interface Shown {
	value: number;
	unit: string;
	display: string;
	value_mm?: number;
}

function show(si: number, dims: Dims, units: Units): Shown {
	if (sameDims(dims, LENGTH)) {
		const mm = si * 1000;
		return {
			value: lengthIn(mm, units),
			unit: units === 'mm' ? 'mm' : 'in',
			display: formatLength(mm, units),
			value_mm: mm
		};
	}
	if (sameDims(dims, ANGLE))
		return { value: si / DEG, unit: 'deg', display: `${(si / DEG).toFixed(2)}°` };
	if (sameDims(dims, FREQUENCY)) return { value: si, unit: 'Hz', display: formatFrequency(si, 6) };
	if (isDimless(dims)) return { value: si, unit: '', display: NUMBER(si) };
	const unit = siUnit(dims);
	return { value: si, unit, display: `${NUMBER(si)} ${unit}` };
}

function checkOptions(opts: EvaluateOptions): void {
	const f = opts.frequencyHz;
	if (!Number.isFinite(f) || f <= 0 || f > MAX_FREQUENCY_HZ) {
		throw new TableInputError(
			'frequency must be a finite number above 0 Hz and at most 1 THz',
			'frequency_hz'
		);
	}
	const band = opts.bandHz;
	if (
		band &&
		!(Number.isFinite(band[0]) && Number.isFinite(band[1]) && band[0] > 0 && band[0] < band[1])
	) {
		throw new TableInputError('band must be [low, high] in Hz with 0 < low < high', 'band_hz');
	}
}

function ratioWarning(
	key: string,
	si: number,
	r: CompiledRatio,
	env: Float64Array,
	f: number
): string | undefined {
	const ratio = si / env[r.slot];
	if (ratio >= r.min && ratio <= r.max) return undefined;
	return (
		`${key} / ${r.of} = ${NUMBER(ratio)} at ${formatFrequency(f, 6)} is outside the range ${r.min} to ${r.max} ` +
		'the design was measured over; this dimension may no longer be right.'
	);
}

const ERROR_DISPLAY = '—';

interface EvalState {
	t: CompiledTable;
	env: Float64Array;
	failed: Uint8Array;
	f: number;
	units: Units;
	band: readonly [number, number] | undefined;
}

function parameterResult(st: EvalState, p: CompiledParameter): ParameterResult {
	const label = p.def.label ?? p.def.key;
	if (p.error) {
		return {
			key: p.def.key,
			label,
			value: null,
			unit: '',
			display: ERROR_DISPLAY,
			warnings: [],
			error: p.error
		};
	}
	const shown = show(p.si, p.dims, st.units);
	const out: ParameterResult = {
		key: p.def.key,
		label,
		value: shown.value,
		unit: shown.unit,
		display: shown.display,
		warnings: []
	};
	if (shown.value_mm !== undefined) out.value_mm = shown.value_mm;
	if (p.ratioNote) out.warnings.push(p.ratioNote);
	if (p.ratio && !st.failed[p.ratio.slot]) {
		const w = ratioWarning(p.def.key, p.si, p.ratio, st.env, st.f);
		if (w) out.warnings.push(w);
	}
	return out;
}

function rowError(st: EvalState, row: CompiledRow, error: LocatedError | undefined): RowResult {
	st.failed[row.slot] = 1;
	const def = row.def;
	return {
		key: def.key,
		label: def.label ?? def.key,
		kind: def.kind,
		value: null,
		unit: '',
		display: ERROR_DISPLAY,
		warnings: [],
		error: error ?? { message: 'cannot compile formula' }
	};
}

function rowResult(st: EvalState, row: CompiledRow): RowResult {
	const { env, f, units, band } = st;
	const def = row.def;
	if (row.error || !row.expr) return rowError(st, row, row.error);
	for (const s of row.deps) {
		if (st.failed[s]) return rowError(st, row, { message: `depends on ${st.t.slotKeys[s]}` });
	}
	let v: number;
	try {
		v = row.expr.run(env);
	} catch (e) {
		if (e instanceof FormulaRuntimeError) return rowError(st, row, { message: e.message });
		throw e;
	}
	if (!Number.isFinite(v)) {
		const message = `the result is not a finite number at ${formatFrequency(f, 6)} (a division by zero, or the root of a negative value?)`;
		return rowError(st, row, { message });
	}
	const warnings: string[] = [];
	let used = v;
	if (def.kind === 'count') {
		used = Math.round(v);
		if (Math.abs(used - v) > 1e-9) warnings.push(`rounded from ${NUMBER(v)} to ${used}`);
	}
	const shown = show(used, row.dims, units);
	const out: RowResult = {
		key: def.key,
		label: def.label ?? def.key,
		kind: def.kind,
		value: shown.value,
		unit: shown.unit,
		display: shown.display,
		warnings
	};
	if (shown.value_mm !== undefined) out.value_mm = shown.value_mm;
	if (row.catalogue) {
		const item = snapToStock(v, row.catalogue);
		used = item.value_m;
		const mm = item.value_m * 1000;
		out.stock = {
			catalogue: row.catalogue,
			name: item.name,
			value_mm: mm,
			display: formatLength(mm, units)
		};
		if (def.kind === 'resonant') out.stock.shift_hz = resonanceShiftHz(f, v, item.value_m - v);
	}
	if (def.kind === 'resonant' && row.isLength) {
		const s = sensitivityFor(f, v, band);
		out.sensitivity = s;
		if (band && (f < band[0] || f > band[1])) {
			warnings.push(
				`the target frequency ${formatFrequency(f, 6)} is outside the band, so no tolerance keeps the resonance inside it`
			);
		} else if (
			s.tolerance_mm !== undefined &&
			def.tolerance_mm !== undefined &&
			def.tolerance_mm > s.tolerance_mm
		) {
			warnings.push(
				`the build tolerance ±${def.tolerance_mm} mm is wider than the ±${s.tolerance_mm.toFixed(3)} mm that keeps the resonance inside the band (first-order estimate)`
			);
		}
	}
	if (row.ratioNote) warnings.push(row.ratioNote);
	if (row.ratio && !st.failed[row.ratio.slot]) {
		const w = ratioWarning(def.key, v, row.ratio, env, f);
		if (w) warnings.push(w);
	}
	env[row.slot] = used;
	return out;
}

export function evaluateTable(t: CompiledTable, opts: EvaluateOptions): TableResult {
	checkOptions(opts);
	const f = opts.frequencyHz;
	const st: EvalState = {
		t,
		env: new Float64Array(t.size),
		failed: new Uint8Array(t.size),
		f,
		units: opts.units ?? 'mm',
		band: opts.bandHz
	};
	st.env[0] = f;
	st.env[1] = C / f;
	st.env[2] = C;
	for (const p of t.parameters) {
		st.env[p.slot] = p.si;
		if (p.error) st.failed[p.slot] = 1;
	}
	const parameters: ParameterResult[] = [];
	for (const p of t.parameters) parameters.push(parameterResult(st, p));
	const rows: RowResult[] = [];
	for (const row of t.rows) rows.push(rowResult(st, row));
	const result: TableResult = {
		frequency_hz: f,
		wavelength_mm: (C / f) * 1000,
		units: st.units,
		parameters,
		rows
	};
	if (st.band) result.band_hz = [st.band[0], st.band[1]];
	return result;
}

/**
 * compileTable then evaluateTable, for one-off use (tests, scripts). Servers keep compiled tables
 * themselves (src/lib/server/dimensions.ts, src/lib/server/evaluate.ts); formulas come from the
 * parse cache either way.
 */
export function computeTable(def: TableDefinition, opts: EvaluateOptions): TableResult {
	return evaluateTable(compileTable(def), opts);
}

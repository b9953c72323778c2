import { parseCsvSweep } from './csv';
import { parseTouchstone } from './touchstone';
import type {
	CsvQuantity,
	FrequencyUnit,
	ParseSweepOptions,
	ReflectionParameter,
	SweepErrorCode,
	SweepFormat,
	SweepParseError,
	SweepParseResult
} from './types';
import { CSV_QUANTITIES, FREQUENCY_UNITS, REFLECTION_PARAMETERS } from './types';

// NUL and other C0 controls (tab, LF, VT, FF, CR allowed) or U+FFFD left by decoding non-UTF-8 bytes.
const NON_TEXT = /[\u0000-\u0008\u000e-\u001f\ufffd]/;

/** Parses a Touchstone (1-port, or one reflection of a 2-port) or CSV sweep. Never throws: every failure is a located SweepParseError. */
export function parseSweep(text: string, options: ParseSweepOptions = {}): SweepParseResult {
	if (typeof text !== 'string') return bad('bad_argument', 'the sweep must be given as text');
	const format = options.format ?? 'auto';
	if (format !== 'auto' && format !== 'touchstone' && format !== 'csv') {
		return bad('bad_argument', 'format must be auto, touchstone or csv', 'format');
	}
	const z0 = options.z0;
	if (z0 !== undefined && !(Number.isFinite(z0) && z0 > 0 && z0 <= 10000)) {
		return bad('bad_argument', 'z0 must be a number above 0 and at most 10000 ohms', 'z0');
	}
	const parameter = options.parameter ?? 's11';
	if (parameter !== 's11' && parameter !== 's22') {
		return bad('bad_argument', 'parameter must be s11 or s22', 'parameter');
	}
	const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
	if (body.trim() === '') return bad('empty', 'the file is empty');
	const junk = NON_TEXT.exec(body);
	if (junk) {
		const before = body.slice(0, junk.index);
		const line = before.split('\n').length;
		const column = junk.index - before.lastIndexOf('\n');
		return {
			ok: false,
			error: {
				code: 'binary',
				message: `this is not a text file (binary or non-UTF-8 data at line ${line}, column ${column}); upload a Touchstone .s1p or a CSV file`,
				line,
				column
			}
		};
	}
	const kind = format === 'auto' ? sniffFormat(body) : format;
	const r =
		kind === 'touchstone' ? parseTouchstone(body, { z0, parameter }) : parseCsvSweep(body, options);
	if (r.ok && parameter === 's22' && r.sweep.ports !== 2) {
		const what = kind === 'csv' ? 'a CSV sweep holds' : 'this is a 1-port file: it holds';
		return bad(
			'no_such_parameter',
			`S22 was asked for, but ${what} one reflection (S11) only: choose S11`,
			'parameter'
		);
	}
	return r;
}

const OPTION_LIKE = /^#\s*((hz|khz|mhz|ghz|[syzhg]|ma|db|ri|r|[\d.e+-]+)(\s+|$))*$/i;

/**
 * Touchstone when the first meaningful line is an option line, a keyword or whitespace-separated
 * numbers; CSV when it holds a comma or semicolon, or words (a header). A '#' line that is not an
 * option line is taken as a CSV comment.
 */
export function sniffFormat(text: string): 'touchstone' | 'csv' {
	const lines = text.slice(0, 65536).split(/\r\n|\r|\n/);
	for (const raw of lines) {
		const line = raw.trim();
		if (line === '') continue;
		const c = line[0];
		const data = line.split('!')[0];
		if (c === '#' && !OPTION_LIKE.test(data)) continue; // a CSV comment line
		if (c === '!' || c === '#' || c === '[') return 'touchstone';
		if (/[,;]/.test(data) || /[a-df-z]/i.test(data)) return 'csv';
		return 'touchstone';
	}
	return 'touchstone';
}

function bad(
	code: SweepErrorCode,
	message: string,
	field?: SweepParseError['field']
): SweepParseResult {
	return { ok: false, error: field ? { code, message, field } : { code, message } };
}

export interface AnalyzeQuery {
	format: SweepFormat;
	z0?: number;
	design_hz?: number;
	band_lo_hz?: number;
	band_hi_hz?: number;
	vswr_max?: number;
	column?: string;
	quantity?: CsvQuantity;
	freq_unit?: FrequencyUnit;
	parameter?: ReflectionParameter;
}

type AnalyzeQueryField = keyof AnalyzeQuery;
export type AnalyzeQueryResult =
	| { ok: true; value: AnalyzeQuery }
	| { ok: false; error: { message: string; field: AnalyzeQueryField } };

const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const QUERY_FIELDS: readonly AnalyzeQueryField[] = [
	'format',
	'z0',
	'design_hz',
	'band_lo_hz',
	'band_hi_hz',
	'vswr_max',
	'column',
	'quantity',
	'freq_unit',
	'parameter'
];

/** Validates the query of a sweep-analysis request; each failure names its field. */
export function parseAnalyzeQuery(params: URLSearchParams): AnalyzeQueryResult {
	const fail = (field: AnalyzeQueryField, message: string): AnalyzeQueryResult => ({
		ok: false,
		error: { message, field }
	});
	for (const field of QUERY_FIELDS) {
		if (params.getAll(field).length > 1) return fail(field, `${field} is given more than once`);
	}
	const value: AnalyzeQuery = { format: 'auto' };
	const format = params.get('format');
	if (format !== null) {
		if (format !== 'auto' && format !== 'touchstone' && format !== 'csv') {
			return fail('format', 'format must be auto, touchstone or csv');
		}
		value.format = format;
	}
	const numbers: [AnalyzeQueryField, (x: number) => boolean, string][] = [
		['z0', (x) => x > 0 && x <= 10000, 'z0 must be above 0 and at most 10000 ohms'],
		['design_hz', (x) => x > 0, 'design_hz must be a frequency above 0 Hz'],
		['band_lo_hz', (x) => x >= 0, 'band_lo_hz must be a frequency of at least 0 Hz'],
		['band_hi_hz', (x) => x > 0, 'band_hi_hz must be a frequency above 0 Hz'],
		['vswr_max', (x) => x > 1, 'vswr_max must be above 1']
	];
	const parsed: Partial<Record<AnalyzeQueryField, number>> = {};
	for (const [field, ok, message] of numbers) {
		const raw = params.get(field);
		if (raw === null) continue;
		const x = DECIMAL.test(raw.trim()) ? Number(raw.trim()) : NaN;
		if (!Number.isFinite(x)) return fail(field, `${field} must be a number, e.g. 2.4e9`);
		if (!ok(x)) return fail(field, message);
		parsed[field] = x;
	}
	Object.assign(value, parsed);
	const lo = value.band_lo_hz;
	const hi = value.band_hi_hz;
	if ((lo === undefined) !== (hi === undefined)) {
		return fail(
			lo === undefined ? 'band_lo_hz' : 'band_hi_hz',
			'give both band_lo_hz and band_hi_hz'
		);
	}
	if (lo !== undefined && hi !== undefined && !(lo < hi)) {
		return fail('band_hi_hz', 'band_lo_hz must be below band_hi_hz');
	}
	if (value.vswr_max !== undefined && lo === undefined) {
		return fail('vswr_max', 'vswr_max needs a claimed band (band_lo_hz and band_hi_hz)');
	}
	const column = params.get('column');
	if (column !== null) {
		if (column.trim() === '' || column.length > 100)
			return fail('column', 'column must be a name or a 1-based number (at most 100 characters)');
		value.column = column.trim();
	}
	const quantity = params.get('quantity');
	if (quantity !== null) {
		const q = CSV_QUANTITIES.find((x) => x === quantity);
		if (!q) return fail('quantity', `quantity must be one of ${CSV_QUANTITIES.join(', ')}`);
		value.quantity = q;
	}
	const unit = params.get('freq_unit');
	if (unit !== null) {
		const u = FREQUENCY_UNITS.find((x) => x.toLowerCase() === unit.toLowerCase());
		if (!u) return fail('freq_unit', `freq_unit must be one of ${FREQUENCY_UNITS.join(', ')}`);
		value.freq_unit = u;
	}
	const parameter = params.get('parameter');
	if (parameter !== null) {
		const p = REFLECTION_PARAMETERS.find((x) => x === parameter.trim().toLowerCase());
		if (!p)
			return fail(
				'parameter',
				'parameter must be s11 or s22 (the reflection read from a 2-port file)'
			);
		value.parameter = p;
	}
	return { ok: true, value };
}

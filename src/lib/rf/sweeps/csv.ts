import { MAX_SWEEP_FREQUENCY_HZ } from '../units/frequency';
import { gammaFromImpedance } from './smith';
import { UNIT_MULT } from './touchstone-options';
import {
	FREQUENCY_RANGE,
	MAX_SWEEP_POINTS,
	decimalNumber,
	failAt,
	keepComment
} from './touchstone';
import { PASSIVE_TOLERANCE, newTally, note, notPassiveMessage, tally } from './warnings';
import { FREQUENCY_UNITS } from './types';
import type { CsvQuantity, ParseSweepOptions, SweepParseResult } from './types';

/**
 * CSV sweep reader: a header naming the frequency column with its unit ("Frequency (MHz)",
 * "freq_hz", "f [GHz]") and the value columns. Delimiter (comma, semicolon, tab) is taken from
 * the header; with semicolons or tabs a comma inside a number is a decimal comma. Resistance
 * and reactance columns in ohms (an antenna analyser's R and X) are converted to Γ for z0.
 */

type Role = CsvQuantity | 're' | 'im' | 'angle' | 'db?' | 's11?' | 'z_re' | 'z_im' | 'unknown';
type Reading =
	| { kind: 'scalar'; col: number; quantity: CsvQuantity }
	| { kind: 'ri'; a: number; b: number }
	| { kind: 'z'; a: number; b: number }
	| { kind: 'polar'; a: number; b: number; db: boolean; radians: boolean };

const QUANTITY_TEXT: Record<CsvQuantity, string> = {
	vswr: 'VSWR',
	rl_db: 'return loss in dB (positive)',
	s11_db: 'S11 in dB (negative)',
	s11_mag: '|S11| (linear magnitude)'
};

interface Field {
	text: string;
	col: number;
}

function splitFields(line: string, delim: string): Field[] {
	const out: Field[] = [];
	let i = 0;
	for (;;) {
		let j = i;
		while (j < line.length && (line[j] === ' ' || line[j] === '\t') && line[j] !== delim) j++;
		if (line[j] === '"') {
			let k = j + 1;
			let text = '';
			for (; k < line.length; k++) {
				if (line[k] === '"') {
					if (line[k + 1] === '"') {
						text += '"';
						k++;
					} else break;
				} else text += line[k];
			}
			out.push({ text: text.trim(), col: j + 1 });
			const next = line.indexOf(delim, k);
			if (next < 0) return out;
			i = next + 1;
		} else {
			const next = line.indexOf(delim, i);
			const end = next < 0 ? line.length : next;
			out.push({ text: line.slice(i, end).trim(), col: j + 1 });
			if (next < 0) return out;
			i = next + 1;
		}
	}
}

function words(header: string): string[] {
	return header
		.toLowerCase()
		.replace(/[γΓ]/g, ' gamma ')
		.split(/[^a-z0-9]+/)
		.filter(Boolean);
}

function frequencyUnit(header: string): { unit: string | null } | null {
	const w = words(header);
	const m = /^(f|freq|frequency|frequencies)(hz|khz|mhz|ghz)?$/.exec(w[0] ?? '');
	if (!m) return null;
	return { unit: m[2] ?? w.slice(1).find((x) => x in UNIT_MULT) ?? null };
}

function role(header: string): Role {
	const w = new Set(words(header));
	const has = (...xs: string[]) => xs.some((x) => w.has(x));
	if (has('vswr', 'swr')) return 'vswr';
	if ((w.has('return') && w.has('loss')) || w.has('rl')) return 'rl_db';
	const ohms = has('z', 'zin', 'ohm', 'ohms', 'impedance');
	if (has('r', 'rs', 'resistance') || (ohms && has('re', 'real'))) return 'z_re';
	if (has('x', 'xs', 'reactance') || (ohms && has('im', 'imag', 'imaginary'))) return 'z_im';
	if (has('re', 'real')) return 're';
	if (has('im', 'imag', 'imaginary')) return 'im';
	if (has('phase', 'angle', 'ang', 'arg', 'deg', 'degrees', 'rad')) return 'angle';
	const s11 = has('s11', 's', 'gamma', 'rho');
	if (has('db', 'logmag') || (w.has('log') && w.has('mag'))) return s11 ? 's11_db' : 'db?';
	if (has('mag', 'magnitude', 'lin', 'linear', 'abs') || /\|\s*s11\s*\|/i.test(header))
		return 's11_mag';
	if (has('gamma', 'rho')) return 's11_mag';
	if (w.has('s11')) return 's11?';
	return 'unknown';
}

function ambiguous(
	message: string,
	field: 'quantity' | 'column' | 'freq_unit',
	choices: string[],
	line?: number
): SweepParseResult {
	const r = failAt('ambiguous', message, line);
	r.error.field = field;
	r.error.choices = choices;
	return r;
}

function askQuantity(
	header: string,
	index: number,
	choices: CsvQuantity[],
	line: number
): SweepParseResult {
	const name = header === '' ? `column ${index + 1} (no name)` : `column ${index + 1} '${header}'`;
	const list = choices.map((q) => `${q} = ${QUANTITY_TEXT[q]}`).join(', ');
	return ambiguous(
		`Which quantity does ${name} hold? Pass quantity as one of: ${list}.`,
		'quantity',
		choices,
		line
	);
}

function choose(
	headers: string[],
	freqCol: number,
	opts: ParseSweepOptions,
	line: number
): Reading | SweepParseResult {
	const roles = headers.map((h, i) => (i === freqCol ? 'unknown' : role(h)));
	const find = (r: Role) => roles.findIndex((x, i) => x === r && i !== freqCol);
	if (opts.column !== undefined) {
		const byName = headers.findIndex(
			(h) => h.toLowerCase() === String(opts.column).trim().toLowerCase()
		);
		const num =
			typeof opts.column === 'number'
				? opts.column
				: /^\d+$/.test(opts.column.trim())
					? Number(opts.column)
					: NaN;
		const col =
			byName >= 0
				? byName
				: Number.isInteger(num) && num >= 1 && num <= headers.length
					? num - 1
					: -1;
		if (col < 0 || col === freqCol) {
			const names = headers.map((h, i) => h || String(i + 1)).filter((_, i) => i !== freqCol);
			return ambiguous(
				`no value column '${opts.column}'; choose one of: ${names.join(', ')}`,
				'column',
				names,
				line
			);
		}
		const r = roles[col];
		const q = opts.quantity ?? (isQuantity(r) ? r : undefined);
		if (!q)
			return askQuantity(
				headers[col],
				col,
				r === 'db?' ? ['rl_db', 's11_db'] : r === 's11?' ? ['s11_db', 's11_mag'] : allQuantities(),
				line
			);
		return { kind: 'scalar', col, quantity: q };
	}
	const re = find('re');
	const im = find('im');
	if (re >= 0 && im >= 0) return { kind: 'ri', a: re, b: im };
	const zr = find('z_re');
	const zi = find('z_im');
	if (zr >= 0 && zi >= 0) return { kind: 'z', a: zr, b: zi };
	const angle = find('angle');
	const mag = find('s11_mag');
	const db = find('s11_db');
	if (angle >= 0 && (mag >= 0 || db >= 0)) {
		const radians = words(headers[angle]).includes('rad');
		return mag >= 0
			? { kind: 'polar', a: mag, b: angle, db: false, radians }
			: { kind: 'polar', a: db, b: angle, db: true, radians };
	}
	const unclear = roles
		.map((_, i) => i)
		.filter(
			(i) => i !== freqCol && (roles[i] === 'db?' || roles[i] === 's11?' || roles[i] === 'unknown')
		);
	if (opts.quantity) {
		const exact = roles.map((_, i) => i).filter((i) => i !== freqCol && roles[i] === opts.quantity);
		const named = unclear.filter((i) => headers[i] !== '');
		const cands = exact.length > 0 ? exact : named.length > 0 ? named : unclear;
		if (cands.length === 1) return { kind: 'scalar', col: cands[0], quantity: opts.quantity };
		const names = cands.map((i) => headers[i] || String(i + 1));
		return ambiguous(
			`several columns could hold ${opts.quantity}; pass column as one of: ${names.join(', ')}`,
			'column',
			names,
			line
		);
	}
	for (const q of ['rl_db', 's11_db', 's11_mag', 'vswr'] as const) {
		const i = find(q);
		if (i >= 0) return { kind: 'scalar', col: i, quantity: q };
	}
	const dbq = find('db?');
	if (dbq >= 0) return askQuantity(headers[dbq], dbq, ['rl_db', 's11_db'], line);
	const s11q = find('s11?');
	if (s11q >= 0) return askQuantity(headers[s11q], s11q, ['s11_db', 's11_mag'], line);
	if (unclear.length === 1)
		return askQuantity(headers[unclear[0]], unclear[0], allQuantities(), line);
	if (unclear.length === 0)
		return failAt('bad_header', 'the file has a frequency column but no value column', line);
	const names = unclear.map((i) => headers[i] || String(i + 1));
	return ambiguous(
		`which column holds the sweep values? Pass column as one of: ${names.join(', ')}, and quantity`,
		'column',
		names,
		line
	);
}

function isQuantity(r: Role): r is CsvQuantity {
	return r === 'vswr' || r === 'rl_db' || r === 's11_db' || r === 's11_mag';
}
function allQuantities(): CsvQuantity[] {
	return ['vswr', 'rl_db', 's11_db', 's11_mag'];
}
function isResult(x: Reading | SweepParseResult): x is SweepParseResult {
	return 'ok' in x;
}

export function parseCsvSweep(text: string, opts: ParseSweepOptions = {}): SweepParseResult {
	const lines = text.split(/\r\n|\r|\n/);
	const comments: string[] = [];
	let h = 0;
	for (; h < lines.length; h++) {
		const t = lines[h].trim();
		if (t === '') continue;
		if (t[0] === '#' || t[0] === '!') keepComment(comments, t.slice(1));
		else break;
	}
	if (h === lines.length) return failAt('no_data', 'the file has no data rows');
	const first = lines[h];
	const delim = first.includes(';')
		? ';'
		: first.includes('\t')
			? '\t'
			: first.includes(',')
				? ','
				: '';
	if (delim === '') {
		return failAt(
			'bad_header',
			'could not find the column delimiter (comma, semicolon or tab) in the first row',
			h + 1
		);
	}
	const decimalComma = delim !== ',';
	const num = (s: string) => decimalNumber(decimalComma ? s.replace(',', '.') : s);
	const headFields = splitFields(first, delim);
	const hasHeader = headFields.some((fl) => fl.text !== '' && Number.isNaN(num(fl.text)));
	let freqCol = 0;
	let mult: number;
	let reading: Reading | SweepParseResult;
	if (hasHeader) {
		const headers = headFields.map((fl) => fl.text);
		freqCol = headers.findIndex((x) => frequencyUnit(x) !== null);
		if (freqCol < 0) {
			return ambiguous(
				`no frequency column found in the header (expected e.g. 'Frequency (MHz)', 'freq_hz', 'f [GHz]')`,
				'column',
				headers,
				h + 1
			);
		}
		const unit = frequencyUnit(headers[freqCol])?.unit ?? opts.freq_unit?.toLowerCase() ?? null;
		if (unit === null || !(unit in UNIT_MULT)) return askUnit(headers[freqCol], h + 1);
		mult = UNIT_MULT[unit];
		reading = choose(headers, freqCol, opts, h + 1);
	} else {
		const unit = opts.freq_unit?.toLowerCase();
		if (!unit || !(unit in UNIT_MULT)) return askUnit('', h + 1);
		mult = UNIT_MULT[unit];
		reading = choose(
			headFields.map(() => ''),
			0,
			opts,
			h + 1
		);
	}
	if (isResult(reading)) return reading;
	return readRows(lines, hasHeader ? h + 1 : h, {
		delim,
		num,
		freqCol,
		mult,
		rd: reading,
		comments,
		z0: opts.z0 ?? 50,
		headers: headFields.map((fl) => fl.text)
	});
}

function askUnit(header: string, line: number): SweepParseResult {
	const what = header ? `the frequency column '${header}' names no unit` : 'the file has no header';
	return ambiguous(
		`${what}: in which unit are the frequencies? Pass freq_unit as one of: ${FREQUENCY_UNITS.join(', ')}.`,
		'freq_unit',
		[...FREQUENCY_UNITS],
		line
	);
}

interface Layout {
	delim: string;
	num: (s: string) => number;
	freqCol: number;
	mult: number;
	rd: Reading;
	comments: string[];
	z0: number;
	headers: string[];
}

function readRows(lines: string[], from: number, L: Layout): SweepParseResult {
	const { delim, num, freqCol, mult, rd, comments, z0 } = L;
	const cap = Math.min(lines.length, MAX_SWEEP_POINTS);
	const f = new Float64Array(cap);
	const re = new Float64Array(cap);
	const im = new Float64Array(cap);
	const raw = new Float64Array(cap);
	const far = newTally();
	const cols = rd.kind === 'scalar' ? [freqCol, rd.col] : [freqCol, rd.a, rd.b];
	const need = Math.max(...cols) + 1;
	let n = 0;
	let prev = -Infinity;
	for (let li = from; li < lines.length; li++) {
		const t = lines[li].trim();
		const lineNo = li + 1;
		if (t === '') continue;
		if (t[0] === '#' || t[0] === '!') {
			keepComment(comments, t.slice(1));
			continue;
		}
		const fields = splitFields(lines[li], delim);
		if (fields.length < need)
			return failAt(
				'field_count',
				`expected at least ${need} columns, found ${fields.length}`,
				lineNo,
				1
			);
		if (n >= MAX_SWEEP_POINTS)
			return failAt(
				'too_many_points',
				`more than ${MAX_SWEEP_POINTS} points: the limit is 200 000 frequencies per sweep`,
				lineNo,
				1
			);
		const v = cols.map((c) => num(fields[c].text));
		const bad = v.findIndex(Number.isNaN);
		if (bad >= 0) {
			const fl = fields[cols[bad]];
			const what = fl.text === '' ? 'empty value' : `'${fl.text.slice(0, 40)}' is not a number`;
			return failAt('not_a_number', what, lineNo, fl.col);
		}
		const fcol = fields[freqCol].col;
		if (!(v[0] >= 0 && v[0] * mult <= MAX_SWEEP_FREQUENCY_HZ)) {
			return failAt('bad_value', FREQUENCY_RANGE, lineNo, fcol);
		}
		if (v[0] <= prev) {
			return v[0] === prev
				? failAt(
						'duplicate_frequency',
						'duplicate frequency: frequencies must increase strictly',
						lineNo,
						fcol
					)
				: failAt(
						'not_increasing',
						'frequency lower than the row before: frequencies must increase strictly',
						lineNo,
						fcol
					);
		}
		prev = v[0];
		const vcol = fields[cols[1]].col;
		const g = gamma(rd, v[1], v[2], z0);
		if (!Array.isArray(g)) return failAt(g.code, g.message, lineNo, vcol);
		tally(far, g[0] * g[0] + g[1] * g[1], lineNo, vcol);
		f[n] = v[0] * mult;
		re[n] = g[0];
		im[n] = g[1];
		raw[n] = v[1];
		n++;
	}
	if (n === 0) return failAt('no_data', 'the file has no data rows');
	const refused = notPassiveMessage(far, n, () => csvHint(rd, raw, n));
	if (refused) return failAt('not_passive', refused, far.line, far.column);
	const used =
		rd.kind === 'scalar'
			? QUANTITY_TEXT[rd.quantity]
			: rd.kind === 'ri'
				? 'real/imaginary S11'
				: rd.kind === 'z'
					? 'resistance and reactance in ohms'
					: 'S11 magnitude/angle';
	comments.push(`csv: values read as ${used}`);
	const warnings =
		rd.kind === 'z'
			? [
					note(
						'converted_from_z',
						`CSV impedance: the columns '${L.headers[rd.a]}' and '${L.headers[rd.b]}' were read as R and X in ohms and converted to S11 for Z0 = ${z0} Ω: Γ = (Z − Z0)/(Z + Z0).`
					)
				]
			: [];
	return {
		ok: true,
		sweep: {
			source: 'csv',
			z0,
			f_hz: f.slice(0, n),
			re: re.slice(0, n),
			im: im.slice(0, n),
			comments,
			phase_known: rd.kind !== 'scalar',
			ports: 1,
			warnings
		}
	};
}

type Refusal = { code: 'bad_value' | 'not_passive'; message: string };
const negative = (): Refusal => ({ code: 'bad_value', message: 'magnitude cannot be negative' });
const infinite = (): Refusal => ({
	code: 'not_passive',
	message: 'this value gives an infinite |S11|, which no passive load has'
});

/** Γ of one row, or why the row cannot be read. Values above |Γ| = 1 are kept (see sweep-warnings). */
function gamma(rd: Reading, a: number, b: number, z0: number): [number, number] | Refusal {
	if (rd.kind === 'ri') return [a, b];
	if (rd.kind === 'z') {
		const g = gammaFromImpedance(a / z0, b / z0);
		if (!(Number.isFinite(g.re) && Number.isFinite(g.im))) {
			return {
				code: 'not_passive',
				message: `R = −${z0} Ω with X = 0 gives an infinite reflection`
			};
		}
		return [g.re, g.im];
	}
	if (rd.kind === 'polar') {
		const mag = rd.db ? Math.pow(10, a / 20) : a;
		if (mag < 0) return negative();
		if (!Number.isFinite(mag)) return infinite();
		const th = rd.radians ? b : (b * Math.PI) / 180;
		return [mag * Math.cos(th), mag * Math.sin(th)];
	}
	let re: number;
	switch (rd.quantity) {
		case 'vswr':
			if (!(a >= 1)) return { code: 'bad_value', message: 'VSWR must be at least 1' };
			re = (a - 1) / (a + 1);
			break;
		case 'rl_db':
			re = Math.pow(10, -a / 20);
			break;
		case 's11_db':
			re = Math.pow(10, a / 20);
			break;
		default:
			if (a < 0) return negative();
			re = a;
	}
	if (!Number.isFinite(re)) return infinite();
	return [re, 0];
}

/** The likeliest reason a CSV column is not a passive reflection, as one sentence, or ''. */
function csvHint(rd: Reading, raw: Float64Array, n: number): string {
	let positive = 0;
	let negative = 0;
	for (let i = 0; i < n; i++) {
		if (raw[i] > PASSIVE_TOLERANCE) positive++;
		else if (raw[i] < -PASSIVE_TOLERANCE) negative++;
	}
	const most = (k: number) => k > n / 2;
	if (rd.kind === 'scalar' && rd.quantity === 's11_db' && most(positive)) {
		return 'S11 in dB is negative: these positive values look like return loss (for return loss pass quantity rl_db).';
	}
	if (rd.kind === 'scalar' && rd.quantity === 'rl_db' && most(negative)) {
		return 'Return loss is positive by definition: these negative values look like S11 in dB (for S11 in dB pass quantity s11_db).';
	}
	if (rd.kind === 'scalar' && rd.quantity === 's11_mag') {
		return 'A linear |S11| lies between 0 and 1: values above 1 look like VSWR or dB figures (pass quantity vswr, rl_db or s11_db).';
	}
	if (rd.kind === 'z' && most(negative)) {
		return 'The resistance is negative at most points, which no passive load has: check the R column.';
	}
	if (rd.kind === 'polar' && rd.db && most(positive)) {
		return 'The dB values are positive, as in a gain measurement or a return loss written without its minus sign.';
	}
	return '';
}

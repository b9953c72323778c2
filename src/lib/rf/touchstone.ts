import type { ReflectionParameter, Sweep, SweepParseResult } from './sweep';
import { renormalizeSweep } from './sweep-metrics';
import {
	DEFAULT_OPTIONS,
	decimalNumber,
	failAt,
	formatHint,
	pairToGamma,
	parseOptionLine,
	type Failure,
	type OptionLine
} from './touchstone-options';
import {
	newTally,
	note,
	notPassiveMessage,
	tally,
	type FarTally,
	type SweepWarning
} from './sweep-warnings';

export { decimalNumber, failAt };

/**
 * Touchstone reader after the IBIS Open Forum Touchstone File Format Specification, Rev 1.1 and
 * Version 2.0, for 1-port and 2-port files. A 2-port gives one reflection (S11, or S22 when
 * asked); a 1-port Z file is converted to Γ. Files with more ports, 2-port Z files and Y, H, G
 * parameters are refused with a message.
 */

export const MAX_SWEEP_POINTS = 200_000;
export const MAX_FREQUENCY_HZ = 1e15;
export const FREQUENCY_RANGE = 'frequency must lie between 0 Hz and 1e15 Hz';
const MAX_COMMENTS = 200;
const MAX_COMMENT_LENGTH = 500;

export function keepComment(comments: string[], text: string): void {
	const t = text.trim();
	if (t !== '' && comments.length < MAX_COMMENTS) comments.push(t.slice(0, MAX_COMMENT_LENGTH));
}

const TEXT = {
	dataCount:
		'expected 3 numbers (frequency and one S11 pair) or 9 (frequency and the four pairs of a 2-port)',
	threePort:
		'this line has 7 numbers, as in a 3-port file: only 1-port and 2-port files are read; export S11 as a 1-port file',
	continued:
		'a line of 8 numbers without a frequency continues the previous data, as in files with 4 or more ports: only 1-port and 2-port files are read; export S11 as a 1-port file',
	twoPortZ:
		'Z-parameters of a 2-port file are not read (S11 needs the whole matrix): export the file as S-parameters',
	optionAfterData: 'option line after data: the option line must precede the data lines',
	tooMany: `more than ${MAX_SWEEP_POINTS} points: the limit is 200 000 frequencies per sweep`,
	duplicate: 'duplicate frequency: frequencies must increase strictly',
	decreasing: 'frequency lower than the line before: frequencies must increase strictly',
	infinite:
		'this pair gives an infinite reflection, which no passive load has: check the format letters on the option line',
	version: '[Version] must be the first line of a Touchstone 2.0 file'
};

interface State {
	opt: OptionLine | null;
	version: 1 | 2;
	first: boolean;
	n: number;
	prev: number;
	/** 0 until known: from [Number of Ports] (v2) or the first data line (v1). */
	ports: number;
	/** Numbers per frequency: 3 for a 1-port, 9 for a 2-port (7 for a v2 Lower or Upper matrix). */
	record: number;
	matrix: 'full' | 'lower' | 'upper';
	nfreq: number;
	nfreqLine: number;
	refs: number[];
	refsPending: boolean;
	refsLine: number;
	inNetworkData: boolean;
	inInformation: boolean;
	inNoise: boolean;
	noiseSkipped: boolean;
	ended: boolean;
	/** v2: numbers of a frequency that continues on the next line, and where it started. */
	carry: string[];
	carryLine: number;
	f: Float64Array;
	re: Float64Array;
	im: Float64Array;
	/** The pair as written, for a hint when the data cannot be passive. */
	ra: Float64Array;
	rb: Float64Array;
	far: FarTally;
	comments: string[];
	parameter: ReflectionParameter;
}

/** Reads a Touchstone 1-port or 2-port file; z0, when given and different from the file's R, renormalizes. */
export function parseTouchstone(
	text: string,
	options: { z0?: number; parameter?: ReflectionParameter } = {}
): SweepParseResult {
	const lines = text.split(/\r\n|\r|\n/);
	const cap = Math.min(lines.length, MAX_SWEEP_POINTS);
	const st: State = {
		opt: null,
		version: 1,
		first: true,
		n: 0,
		prev: -Infinity,
		ports: 0,
		record: 3,
		matrix: 'full',
		nfreq: -1,
		nfreqLine: 0,
		refs: [],
		refsPending: false,
		refsLine: 0,
		inNetworkData: false,
		inInformation: false,
		inNoise: false,
		noiseSkipped: false,
		ended: false,
		carry: [],
		carryLine: 0,
		f: new Float64Array(cap),
		re: new Float64Array(cap),
		im: new Float64Array(cap),
		ra: new Float64Array(cap),
		rb: new Float64Array(cap),
		far: newTally(),
		comments: [],
		parameter: options.parameter ?? 's11'
	};
	for (let li = 0; li < lines.length && !st.ended; li++) {
		let line = lines[li];
		const bang = line.indexOf('!');
		if (bang >= 0) {
			keepComment(st.comments, line.slice(bang + 1));
			line = line.slice(0, bang);
		}
		let p = 0;
		while (p < line.length && line.charCodeAt(p) <= 32) p++;
		if (p === line.length) continue;
		const c = line.charCodeAt(p);
		const err =
			c === 91 // [
				? onKeyword(st, line, p, li + 1)
				: st.inInformation
					? null
					: c === 35 // #
						? onOption(st, line, p, li + 1)
						: onData(st, line, p, li + 1);
		if (err) return err;
	}
	return finish(st, lines.length, options.z0);
}

function finish(st: State, lineCount: number, z0?: number): SweepParseResult | Failure {
	const { n, version } = st;
	if (version === 2 && !st.ended) {
		return failAt(
			'missing_keyword',
			'[End] is required at the end of a Touchstone 2.0 file',
			lineCount
		);
	}
	if (n === 0) return failAt('no_data', 'the file has no data lines');
	if (version === 2 && st.nfreq !== n) {
		const msg = `[Number of Frequencies] says ${st.nfreq} but the file has ${n} data lines`;
		return failAt('count_mismatch', msg, st.nfreqLine);
	}
	const opt = st.opt ?? DEFAULT_OPTIONS;
	const port = st.ports === 2 && st.parameter === 's22' ? 2 : 1;
	const r = st.refs[port - 1] ?? st.refs[0] ?? opt.r;
	const refused = notPassiveMessage(st.far, n, formatHint(opt, st.ra, st.rb, n, zScale(st, r)));
	if (refused) return failAt('not_passive', refused, st.far.line, st.far.column);
	const sweep: Sweep = {
		source: 'touchstone',
		z0: r,
		f_hz: st.f.slice(0, n),
		re: st.re.slice(0, n),
		im: st.im.slice(0, n),
		comments: st.comments,
		phase_known: true,
		version,
		ports: st.ports === 2 ? 2 : 1,
		warnings: readerNotes(st, opt, r)
	};
	return {
		ok: true,
		sweep: z0 !== undefined && z0 !== sweep.z0 ? renormalizeSweep(sweep, z0) : sweep
	};
}

/** Z values are normalized to R in Touchstone 1.x files and given in ohms in 2.0 files. */
const zScale = (st: State, r: number) => (st.version === 2 ? r : 1);

function readerNotes(st: State, opt: OptionLine, r: number): SweepWarning[] {
	const out: SweepWarning[] = [];
	if (opt.rLoose && st.refs.length === 0) {
		out.push(
			note(
				'option_r_without_value',
				`Line ${opt.line}: the option line '${opt.text}' gives R without a value; it was read as R 50, the Touchstone default of 50 Ω. Check that the instrument measured against 50 Ω.`
			)
		);
	}
	if (opt.param === 'z') {
		const how =
			st.version === 2
				? 'Z11 in ohms, as Touchstone 2.0 writes it,'
				: `Z11, normalized to R = ${r} Ω as Touchstone 1.x writes it,`;
		out.push(
			note(
				'converted_from_z',
				`Z-parameter file: ${how} was converted to S11 for the file's reference impedance of ${r} Ω: Γ = (Z − R)/(Z + R).`
			)
		);
	}
	if (st.ports === 2) {
		const used =
			st.parameter === 's22'
				? `S22, the reflection at port 2 with port 1 terminated in its reference impedance, was used (${r} Ω); S11, S21 and S12 were not.`
				: `S11, the reflection at port 1 with port 2 terminated in its reference impedance, was used (${r} Ω); S21, S12 and S22 were not. Choose S22 in the file options to read port 2 instead.`;
		const noise = st.noiseSkipped
			? ' The noise parameters after the network data were skipped.'
			: '';
		out.push(note('two_port_parameter', `2-port file: ${used}${noise}`));
	}
	return out;
}

function onOption(st: State, line: string, p: number, lineNo: number): Failure | null {
	st.first = false;
	if (st.n > 0) return failAt('option_after_data', TEXT.optionAfterData, lineNo, p + 1);
	if (st.opt) return null; // only the first option line counts
	const o = parseOptionLine(line, lineNo);
	if ('ok' in o) return o;
	st.opt = o;
	return null;
}

function setPorts(st: State, ports: number, lineNo: number, column: number): Failure | null {
	if ((st.opt ?? DEFAULT_OPTIONS).param === 'z' && ports === 2) {
		return failAt('unsupported_parameter', TEXT.twoPortZ, lineNo, column);
	}
	st.ports = ports;
	st.record = ports === 1 ? 3 : st.matrix === 'full' ? 9 : 7;
	return null;
}

function onKeyword(st: State, line: string, p: number, lineNo: number): Failure | null {
	const close = line.indexOf(']', p);
	if (close < 0) return failAt('bad_keyword', 'keyword without a closing ]', lineNo, p + 1);
	const key = line
		.slice(p + 1, close)
		.trim()
		.toLowerCase()
		.replace(/\s+/g, ' ');
	const rest = line.slice(close + 1).trim();
	const at = line.length - line.slice(close + 1).trimStart().length + 1; // column of rest
	const wasFirst = st.first;
	st.first = false;
	if (st.inInformation) {
		if (key === 'end information') st.inInformation = false;
		return null;
	}
	if (key === 'version') {
		if (!wasFirst) return failAt('bad_keyword', TEXT.version, lineNo, p + 1);
		if (!/^2(\.\d+)?$/.test(rest)) {
			return failAt(
				'bad_keyword',
				`unsupported Touchstone version '${rest}' (expected 2.0)`,
				lineNo,
				at
			);
		}
		st.version = 2;
		return null;
	}
	if (st.version === 1) {
		const msg = `keyword [${key}] belongs to Touchstone 2.0 files, which start with [Version] 2.0`;
		return failAt('bad_keyword', msg, lineNo, p + 1);
	}
	if (st.refsPending) return referenceShort(st);
	if (st.carry.length > 0) return recordShort(st);
	if (st.n > 0 && key !== 'end' && key !== 'noise data' && key !== 'number of noise frequencies') {
		return failAt(
			'bad_keyword',
			`keyword [${key}] after the network data; expected [End]`,
			lineNo,
			p + 1
		);
	}
	const int = /^\d+$/.test(rest) ? Number(rest) : NaN;
	switch (key) {
		case 'number of ports':
			if (!(int >= 1))
				return failAt('bad_keyword', '[Number of Ports] needs a whole number', lineNo, at);
			if (int > 2) {
				const msg = `this file has ${int} ports: only 1-port and 2-port files are read; export S11 as a 1-port file`;
				return failAt('too_many_ports', msg, lineNo, at);
			}
			return setPorts(st, int, lineNo, at);
		case 'number of frequencies':
			if (!(int >= 1)) {
				return failAt(
					'bad_keyword',
					'[Number of Frequencies] needs a whole number above 0',
					lineNo,
					at
				);
			}
			st.nfreq = int;
			st.nfreqLine = lineNo;
			return null;
		case 'reference':
			st.refsPending = true;
			st.refsLine = lineNo;
			return rest === '' ? null : onReference(st, rest, lineNo, at);
		case 'matrix format': {
			const m = rest.toLowerCase();
			if (m !== 'full' && m !== 'lower' && m !== 'upper') {
				return failAt('bad_keyword', '[Matrix Format] is Full, Lower or Upper', lineNo, at);
			}
			st.matrix = m;
			if (st.ports) st.record = st.ports === 1 ? 3 : m === 'full' ? 9 : 7;
			return null;
		}
		case 'two-port data order':
		case 'number of noise frequencies':
			return null;
		case 'begin information':
			st.inInformation = true;
			return null;
		case 'network data':
			if (st.ports === 0) {
				return failAt(
					'missing_keyword',
					'[Number of Ports] must come before [Network Data]',
					lineNo,
					p + 1
				);
			}
			if (st.nfreq < 0) {
				return failAt(
					'missing_keyword',
					'[Number of Frequencies] must come before [Network Data]',
					lineNo,
					p + 1
				);
			}
			st.inNetworkData = true;
			return null;
		case 'noise data':
			if (st.ports !== 2) {
				return failAt('bad_keyword', '[Noise Data] belongs to 2-port files', lineNo, p + 1);
			}
			st.inNoise = true;
			st.noiseSkipped = true;
			return null;
		case 'end':
			st.ended = true;
			return null;
		default:
			return failAt('bad_keyword', `unknown keyword [${key}]`, lineNo, p + 1);
	}
}

/** [Reference] values, one per port, on its own line or the lines after it. */
function onReference(st: State, text: string, lineNo: number, column: number): Failure | null {
	for (const tok of text.split(/\s+/)) {
		const r = decimalNumber(tok);
		if (!(r > 0)) return referenceShort(st, lineNo, column);
		st.refs.push(r);
	}
	if (st.refs.length >= Math.max(1, st.ports)) {
		st.refsPending = false;
		if (st.refs.length > Math.max(1, st.ports)) return referenceShort(st, lineNo, column);
	}
	return null;
}

function referenceShort(st: State, line = st.refsLine, column?: number): Failure {
	const ports = Math.max(1, st.ports);
	const msg = `[Reference] takes one positive impedance per port (${ports} for this file)`;
	return failAt('bad_keyword', msg, line, column);
}

function recordShort(st: State): Failure {
	const msg = `the data of this frequency stop after ${st.carry.length} of ${st.record} numbers`;
	return failAt('field_count', msg, st.carryLine, 1);
}

/** Start and end offsets of the whitespace-separated tokens of a line, from p. */
function tokens(line: string, p: number): number[] {
	const out: number[] = [];
	let q = p;
	while (q < line.length) {
		const s = q;
		while (q < line.length && line.charCodeAt(q) > 32) q++;
		out.push(s, q);
		while (q < line.length && line.charCodeAt(q) <= 32) q++;
	}
	return out;
}

function onData(st: State, line: string, p: number, lineNo: number): Failure | null {
	if (st.refsPending) return onReference(st, line.slice(p).trim(), lineNo, p + 1);
	st.first = false;
	if (st.inNoise || (st.noiseSkipped && st.version === 1)) return null;
	if (st.version === 2 && !st.inNetworkData) {
		return failAt('missing_keyword', 'data before [Network Data]', lineNo, p + 1);
	}
	const t = tokens(line, p);
	const count = t.length / 2;
	if (st.version === 2) return onDataV2(st, line, t, lineNo);
	if (st.ports === 0) {
		if (count === 7) return failAt('too_many_ports', TEXT.threePort, lineNo, p + 1);
		if (count === 3 || count === 9) {
			const e = setPorts(st, count === 3 ? 1 : 2, lineNo, p + 1);
			if (e) return e;
		}
	}
	if (count === st.record) return onRecord(st, line, t, lineNo);
	if (st.ports === 2 && count === 8) return failAt('too_many_ports', TEXT.continued, lineNo, p + 1);
	if (st.ports === 2 && count === 5 && decimalNumber(line.slice(t[0], t[1])) <= st.prev) {
		// Touchstone 1.x 2-port noise parameters: a 5-number block whose frequencies start again
		st.noiseSkipped = true;
		return null;
	}
	const expected =
		st.ports === 1
			? 'expected 3 numbers (frequency and one S11 pair)'
			: st.ports === 2
				? 'expected 9 numbers (frequency and the four pairs of a 2-port)'
				: TEXT.dataCount;
	return failAt('field_count', `${expected}, found ${count}`, lineNo, p + 1);
}

/** Version 2: a frequency's numbers may continue on the following lines. */
function onDataV2(st: State, line: string, t: number[], lineNo: number): Failure | null {
	if (st.carry.length === 0 && t.length / 2 === st.record) return onRecord(st, line, t, lineNo);
	if (st.carry.length === 0) st.carryLine = lineNo;
	for (let k = 0; k < t.length; k += 2) st.carry.push(line.slice(t[k], t[k + 1]));
	if (st.carry.length > st.record) {
		const msg = `expected ${st.record} numbers for this frequency (the frequency and ${(st.record - 1) / 2} ${st.record === 3 ? 'pair' : 'pairs'}), found ${st.carry.length}`;
		return failAt('field_count', msg, st.carryLine, 1);
	}
	if (st.carry.length < st.record) return null;
	// the joined record, located at the line where it started
	const joined = st.carry.join(' ');
	st.carry = [];
	return onRecord(st, joined, tokens(joined, 0), st.carryLine, true);
}

const G = { re: 0, im: 0 };
const NUMS = new Float64Array(9);

function onRecord(
	st: State,
	line: string,
	t: number[],
	lineNo: number,
	joined = false
): Failure | null {
	const col = (k: number) => (joined ? 1 : t[2 * k] + 1);
	for (let k = 0; k < t.length; k += 2) {
		const v = decimalNumber(line.slice(t[k], t[k + 1]));
		if (v !== v) {
			const s = t[k];
			return failAt(
				'not_a_number',
				`'${line.slice(s, Math.min(t[k + 1], s + 40))}' is not a number`,
				lineNo,
				col(k / 2)
			);
		}
		NUMS[k / 2] = v;
	}
	if (st.n >= MAX_SWEEP_POINTS) return failAt('too_many_points', TEXT.tooMany, lineNo, 1);
	const o = st.opt ?? (st.opt = { ...DEFAULT_OPTIONS });
	const fv = NUMS[0];
	if (!(fv >= 0 && fv * o.mult <= MAX_FREQUENCY_HZ)) {
		return failAt('bad_value', FREQUENCY_RANGE, lineNo, col(0));
	}
	if (fv <= st.prev) {
		return fv === st.prev
			? failAt('duplicate_frequency', TEXT.duplicate, lineNo, col(0))
			: failAt('not_increasing', TEXT.decreasing, lineNo, col(0));
	}
	st.prev = fv;
	// the pair's first number: S11 comes first; S22 last (in Full, Lower and Upper matrices alike)
	const k = st.ports === 2 && st.parameter === 's22' ? st.record - 2 : 1;
	const a = NUMS[k];
	const b = NUMS[k + 1];
	if (o.format === 'ma' && a < 0) {
		return failAt('bad_value', 'magnitude cannot be negative', lineNo, col(k));
	}
	const r = k === 1 ? st.refs[0] : (st.refs[1] ?? st.refs[0]);
	pairToGamma(o.format, o.param, a, b, st.version === 2 ? (r ?? o.r) : 1, G);
	const g2 = G.re * G.re + G.im * G.im;
	if (!Number.isFinite(g2)) return failAt('not_passive', TEXT.infinite, lineNo, col(k));
	tally(st.far, g2, lineNo, col(k));
	const n = st.n++;
	st.f[n] = fv * o.mult;
	st.re[n] = G.re;
	st.im[n] = G.im;
	st.ra[n] = a;
	st.rb[n] = b;
	return null;
}

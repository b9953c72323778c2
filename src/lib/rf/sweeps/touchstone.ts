import { DEG } from '../units/constants';
import { HZ_PER_UNIT, MAX_SWEEP_FREQUENCY_HZ } from '../units/frequency';
import { FREQUENCY_UNITS } from './types';
import type { Sweep, SweepErrorCode, SweepParseError, SweepParseResult } from './types';
import { renormalizeSweep } from './metrics';

/**
 * Touchstone 1-port reader after the IBIS Open Forum Touchstone File Format Specification,
 * Rev 1.1 and Version 2.0. Only S-parameters are read: Y and Z files are refused (their
 * normalization differs between the versions), H and G exist only for 2-ports.
 */

export const MAX_SWEEP_POINTS = 200_000;
/** |Γ| above 1 by more than printing round-off is refused as non-passive data. */
export const PASSIVE_TOLERANCE = 1e-9;
export const FREQUENCY_RANGE = `frequency must lie between 0 Hz and ${MAX_SWEEP_FREQUENCY_HZ} Hz`;
const MAX_COMMENTS = 200;
const MAX_COMMENT_LENGTH = 500;

type Failure = { ok: false; error: SweepParseError };

export function failAt(
	code: SweepErrorCode,
	message: string,
	line?: number,
	column?: number
): Failure {
	const error: SweepParseError = { code, message };
	if (line !== undefined) error.line = line;
	if (column !== undefined) error.column = column;
	return { ok: false, error };
}

/** Number() on decimal text; NaN for '', non-finite values and the 0x/0b/0o forms Number() would accept. */
export function decimalNumber(s: string): number {
	const v = Number(s);
	if (v - v !== 0 || s.length === 0 || s.charCodeAt(0) <= 32) return NaN;
	if (s.length > 2 && s.charCodeAt(0) === 48) {
		const c = s.charCodeAt(1) | 32;
		if (c === 120 || c === 98 || c === 111) return NaN;
	}
	return v;
}

export function keepComment(comments: string[], text: string): void {
	const t = text.trim();
	if (t !== '' && comments.length < MAX_COMMENTS) comments.push(t.slice(0, MAX_COMMENT_LENGTH));
}

const UNITS: Record<string, number> = Object.fromEntries(
	FREQUENCY_UNITS.map((u) => [u.toLowerCase(), HZ_PER_UNIT[u]])
);
type DataFormat = 'ma' | 'db' | 'ri';
interface OptionLine {
	mult: number;
	format: DataFormat;
	r: number;
}

function parseOptionLine(line: string, lineNo: number): OptionLine | Failure {
	const opt: OptionLine = { mult: 1e9, format: 'ma', r: 50 };
	const seen = new Set<string>();
	const re = /\S+/g;
	re.lastIndex = line.indexOf('#') + 1;
	let m: RegExpExecArray | null;
	while ((m = re.exec(line))) {
		const tok = m[0].toLowerCase();
		const col = m.index + 1;
		let kind: string;
		if (tok in UNITS) {
			kind = 'frequency unit';
			opt.mult = UNITS[tok];
		} else if (tok === 's') kind = 'parameter';
		else if (tok === 'y' || tok === 'z') {
			return failAt(
				'unsupported_parameter',
				`${tok.toUpperCase()}-parameter files are not supported: export S-parameters (S11) instead`,
				lineNo,
				col
			);
		} else if (tok === 'h' || tok === 'g') {
			return failAt(
				'unsupported_parameter',
				`${tok.toUpperCase()}-parameters describe 2-port networks; only 1-port S-parameter (S11) files are supported`,
				lineNo,
				col
			);
		} else if (tok === 'ma' || tok === 'db' || tok === 'ri') {
			kind = 'data format';
			opt.format = tok;
		} else if (tok === 'r') {
			kind = 'reference impedance';
			const v = re.exec(line);
			const r = v ? decimalNumber(v[0]) : NaN;
			if (!(r > 0)) {
				return failAt(
					'bad_option',
					'R must be followed by a positive reference impedance in ohms',
					lineNo,
					v ? v.index + 1 : col
				);
			}
			opt.r = r;
		} else {
			return failAt(
				'bad_option',
				`unknown option '${m[0]}': the option line reads # <Hz|kHz|MHz|GHz> S <DB|MA|RI> R <ohms>`,
				lineNo,
				col
			);
		}
		if (seen.has(kind)) return failAt('bad_option', `the ${kind} is given twice`, lineNo, col);
		seen.add(kind);
	}
	return opt;
}

function isFailure(x: unknown): x is Failure {
	return typeof x === 'object' && x !== null && (x as Failure).ok === false;
}

const TEXT = {
	twoPort:
		'only 1-port Touchstone files are supported (this line has 9 numbers, as in a 2-port .s2p file)',
	optionAfterData: 'option line after data: the option line must precede the data lines',
	notPassive: '|S11| > 1: not valid data for a passive antenna (check the format and calibration)',
	tooMany: `more than ${MAX_SWEEP_POINTS} points: the limit is 200 000 frequencies per sweep`,
	duplicate: 'duplicate frequency: frequencies must increase strictly',
	decreasing: 'frequency lower than the line before: frequencies must increase strictly',
	reference: '[Reference] of a 1-port file takes one positive impedance',
	version: '[Version] must be the first line of a Touchstone 2.0 file'
};

interface State {
	opt: OptionLine | null;
	version: 1 | 2;
	first: boolean;
	n: number;
	prev: number;
	ports: number;
	nfreq: number;
	nfreqLine: number;
	reference: number;
	referencePending: boolean;
	inNetworkData: boolean;
	inInformation: boolean;
	ended: boolean;
	f: Float64Array;
	re: Float64Array;
	im: Float64Array;
	comments: string[];
}

/** Reads a Touchstone 1-port file; z0, when given and different from the file's R, renormalizes. */
export function parseTouchstone(text: string, options: { z0?: number } = {}): SweepParseResult {
	const lines = text.split(/\r\n|\r|\n/);
	const cap = Math.min(lines.length, MAX_SWEEP_POINTS);
	const st: State = {
		opt: null,
		version: 1,
		first: true,
		n: 0,
		prev: -Infinity,
		ports: 0,
		nfreq: -1,
		nfreqLine: 0,
		reference: NaN,
		referencePending: false,
		inNetworkData: false,
		inInformation: false,
		ended: false,
		f: new Float64Array(cap),
		re: new Float64Array(cap),
		im: new Float64Array(cap),
		comments: []
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
	const { n, version } = st;
	if (version === 2 && !st.ended) {
		return failAt(
			'missing_keyword',
			'[End] is required at the end of a Touchstone 2.0 file',
			lines.length
		);
	}
	if (n === 0) return failAt('no_data', 'the file has no data lines');
	if (version === 2 && st.nfreq !== n) {
		const msg = `[Number of Frequencies] says ${st.nfreq} but the file has ${n} data lines`;
		return failAt('count_mismatch', msg, st.nfreqLine);
	}
	const sweep: Sweep = {
		source: 'touchstone',
		z0: version === 2 && st.reference > 0 ? st.reference : (st.opt?.r ?? 50),
		f_hz: st.f.slice(0, n),
		re: st.re.slice(0, n),
		im: st.im.slice(0, n),
		comments: st.comments,
		phase_known: true,
		version
	};
	const z0 = options.z0;
	return {
		ok: true,
		sweep: z0 !== undefined && z0 !== sweep.z0 ? renormalizeSweep(sweep, z0) : sweep
	};
}

function onOption(st: State, line: string, p: number, lineNo: number): Failure | null {
	st.first = false;
	if (st.n > 0) return failAt('option_after_data', TEXT.optionAfterData, lineNo, p + 1);
	if (st.opt) return null; // only the first option line counts
	const o = parseOptionLine(line, lineNo);
	if (isFailure(o)) return o;
	st.opt = o;
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
				close + 2
			);
		}
		st.version = 2;
		return null;
	}
	if (st.version === 1) {
		const msg = `keyword [${key}] belongs to Touchstone 2.0 files, which start with [Version] 2.0`;
		return failAt('bad_keyword', msg, lineNo, p + 1);
	}
	if (st.n > 0 && key !== 'end') {
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
				return failAt('bad_keyword', '[Number of Ports] needs a whole number', lineNo, close + 2);
			if (int !== 1) {
				const msg = `only 1-port Touchstone files are supported (this file has ${int} ports)`;
				return failAt('two_port', msg, lineNo, close + 2);
			}
			st.ports = 1;
			return null;
		case 'number of frequencies':
			if (!(int >= 1)) {
				return failAt(
					'bad_keyword',
					'[Number of Frequencies] needs a whole number above 0',
					lineNo,
					close + 2
				);
			}
			st.nfreq = int;
			st.nfreqLine = lineNo;
			return null;
		case 'reference': {
			if (rest === '') {
				st.referencePending = true;
				return null;
			}
			const r = decimalNumber(rest);
			if (!(r > 0)) return failAt('bad_keyword', TEXT.reference, lineNo, close + 2);
			st.reference = r;
			return null;
		}
		case 'two-port data order':
		case 'matrix format':
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
		case 'end':
			st.ended = true;
			return null;
		case 'noise data':
			return failAt(
				'two_port',
				'noise data belongs to 2-port files; only 1-port files are supported',
				lineNo,
				p + 1
			);
		default:
			return failAt('bad_keyword', `unknown keyword [${key}]`, lineNo, p + 1);
	}
}

function nextToken(line: string, q: number): number {
	while (q < line.length && line.charCodeAt(q) <= 32) q++;
	return q;
}
function tokenEnd(line: string, q: number): number {
	while (q < line.length && line.charCodeAt(q) > 32) q++;
	return q;
}

function onData(st: State, line: string, p: number, lineNo: number): Failure | null {
	const s0 = p;
	const e0 = tokenEnd(line, s0);
	const s1 = nextToken(line, e0);
	const e1 = tokenEnd(line, s1);
	const s2 = nextToken(line, e1);
	const e2 = tokenEnd(line, s2);
	const more = nextToken(line, e2) < line.length;
	if (st.referencePending) {
		st.referencePending = false;
		const r = decimalNumber(line.slice(s0, e0));
		if (s1 < line.length || !(r > 0)) return failAt('bad_keyword', TEXT.reference, lineNo, p + 1);
		st.reference = r;
		return null;
	}
	st.first = false;
	if (st.version === 2 && !st.inNetworkData) {
		return failAt('missing_keyword', 'data before [Network Data]', lineNo, p + 1);
	}
	if (more || s2 === line.length) {
		let count = 0;
		for (let q = p; q < line.length; q = nextToken(line, tokenEnd(line, q))) count++;
		if (count === 9) return failAt('two_port', TEXT.twoPort, lineNo, p + 1);
		const msg = `expected 3 numbers (frequency and one S11 pair), found ${count}`;
		return failAt('field_count', msg, lineNo, p + 1);
	}
	if (st.n >= MAX_SWEEP_POINTS) return failAt('too_many_points', TEXT.tooMany, lineNo, 1);
	const o = st.opt ?? (st.opt = { mult: 1e9, format: 'ma', r: 50 });
	const fv = decimalNumber(line.slice(s0, e0));
	const a = decimalNumber(line.slice(s1, e1));
	const b = decimalNumber(line.slice(s2, e2));
	if (fv !== fv || a !== a || b !== b) {
		const [s, e] = fv !== fv ? [s0, e0] : a !== a ? [s1, e1] : [s2, e2];
		return failAt(
			'not_a_number',
			`'${line.slice(s, Math.min(e, s + 40))}' is not a number`,
			lineNo,
			s + 1
		);
	}
	if (!(fv >= 0 && fv * o.mult <= MAX_SWEEP_FREQUENCY_HZ)) {
		return failAt('bad_value', FREQUENCY_RANGE, lineNo, s0 + 1);
	}
	if (fv <= st.prev) {
		return fv === st.prev
			? failAt('duplicate_frequency', TEXT.duplicate, lineNo, s0 + 1)
			: failAt('not_increasing', TEXT.decreasing, lineNo, s0 + 1);
	}
	st.prev = fv;
	let gr = a;
	let gi = b;
	if (o.format !== 'ri') {
		if (o.format === 'ma' && a < 0) {
			return failAt('bad_value', 'magnitude cannot be negative', lineNo, s1 + 1);
		}
		const mag = o.format === 'ma' ? a : Math.pow(10, a / 20);
		const th = b * DEG;
		gr = mag * Math.cos(th);
		gi = mag * Math.sin(th);
	}
	if (!(gr * gr + gi * gi <= PASSIVE_LIMIT_SQ))
		return failAt('not_passive', TEXT.notPassive, lineNo, s1 + 1);
	const n = st.n++;
	st.f[n] = fv * o.mult;
	st.re[n] = gr;
	st.im[n] = gi;
	return null;
}

const PASSIVE_LIMIT_SQ = (1 + PASSIVE_TOLERANCE) ** 2;

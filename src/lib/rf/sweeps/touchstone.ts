import { MAX_SWEEP_FREQUENCY_HZ } from '../units/frequency';
import { renormalizeSweep } from './metrics';
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
import { onKeyword, onReference, setPorts, type State } from './touchstone-keywords';
import type { ReflectionParameter, Sweep, SweepParseResult, SweepWarning } from './types';
import { newTally, note, notPassiveMessage, tally } from './warnings';

export { decimalNumber, failAt };

/**
 * Touchstone reader after the IBIS Open Forum Touchstone File Format Specification, Rev 1.1 and
 * Version 2.0, for 1-port and 2-port files. A 2-port gives one reflection (S11, or S22 when
 * asked); a 1-port Z file is converted to Γ. Files with more ports, 2-port Z files and Y, H, G
 * parameters are refused with a message.
 */

export const MAX_SWEEP_POINTS = 200_000;
export const FREQUENCY_RANGE = `frequency must lie between 0 Hz and ${MAX_SWEEP_FREQUENCY_HZ} Hz`;
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
	optionAfterData: 'option line after data: the option line must precede the data lines',
	tooMany: `more than ${MAX_SWEEP_POINTS} points: the limit is 200 000 frequencies per sweep`,
	duplicate: 'duplicate frequency: frequencies must increase strictly',
	decreasing: 'frequency lower than the line before: frequencies must increase strictly',
	infinite:
		'this pair gives an infinite reflection, which no passive load has: check the format letters on the option line'
};

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
	const refused = notPassiveMessage(st.far, n, () =>
		formatHint(opt, st.ra, st.rb, n, zScale(st, r))
	);
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
				`Line ${opt.line}: the option line '${opt.text.slice(0, 80)}' gives R without a value; it was read as R 50, the Touchstone default of 50 Ω. Check that the instrument measured against 50 Ω.`
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
				? `S22 was used: the reflection at port 2, referred to ${r} Ω, with port 1 terminated in its reference impedance; S11, S21 and S12 were not.`
				: `S11 was used: the reflection at port 1, referred to ${r} Ω, with port 2 terminated in its reference impedance; S21, S12 and S22 were not. Choose S22 in the file options (parameter=s22 in the API) to read port 2 instead.`;
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

/** Start and end offsets of a data line's first 9 tokens (TOK) and the count of all. */
const TOK = new Int32Array(18);
function tokens(line: string, p: number): number {
	let q = p;
	let count = 0;
	while (q < line.length) {
		const s = q;
		while (q < line.length && line.charCodeAt(q) > 32) q++;
		if (count < 9) {
			TOK[2 * count] = s;
			TOK[2 * count + 1] = q;
		}
		count++;
		while (q < line.length && line.charCodeAt(q) <= 32) q++;
	}
	return count;
}

function onData(st: State, line: string, p: number, lineNo: number): Failure | null {
	if (st.refsPending) return onReference(st, line.slice(p).trim(), lineNo, p + 1);
	st.first = false;
	if (st.inNoise || (st.noiseSkipped && st.version === 1)) return null;
	if (st.version === 2 && !st.inNetworkData) {
		return failAt('missing_keyword', 'data before [Network Data]', lineNo, p + 1);
	}
	const count = tokens(line, p);
	if (st.version === 2) return onDataV2(st, line, count, lineNo);
	if (st.ports === 0) {
		if (count === 7) return failAt('too_many_ports', TEXT.threePort, lineNo, p + 1);
		if (count === 3 || count === 9) {
			const e = setPorts(st, count === 3 ? 1 : 2, lineNo, p + 1);
			if (e) return e;
		}
	}
	if (count === st.record) return onRecord(st, line, count, lineNo, false);
	if (st.ports === 2 && count === 8) return failAt('too_many_ports', TEXT.continued, lineNo, p + 1);
	if (st.ports === 2 && count === 5 && decimalNumber(line.slice(TOK[0], TOK[1])) <= st.prev) {
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
function onDataV2(st: State, line: string, count: number, lineNo: number): Failure | null {
	if (st.carry.length === 0 && count === st.record) {
		return onRecord(st, line, count, lineNo, false);
	}
	if (st.carry.length === 0) st.carryLine = lineNo;
	if (st.carry.length + count > st.record) {
		const msg = `expected ${st.record} numbers for this frequency (the frequency and ${(st.record - 1) / 2} ${st.record === 3 ? 'pair' : 'pairs'}), found ${st.carry.length + count}`;
		return failAt('field_count', msg, st.carryLine, 1);
	}
	for (let k = 0; k < count; k++) st.carry.push(line.slice(TOK[2 * k], TOK[2 * k + 1]));
	if (st.carry.length < st.record) return null;
	// the joined record, located at the line where it started
	const joined = st.carry.join(' ');
	st.carry = [];
	return onRecord(st, joined, tokens(joined, 0), st.carryLine, true);
}

const G = { re: 0, im: 0 };
const NUMS = new Float64Array(9);

/** One frequency's numbers, in TOK; `joined` when gathered from several lines (columns are then 1). */
function onRecord(
	st: State,
	line: string,
	count: number,
	lineNo: number,
	joined: boolean
): Failure | null {
	for (let k = 0; k < count; k++) {
		const s = TOK[2 * k];
		const v = decimalNumber(line.slice(s, TOK[2 * k + 1]));
		if (v !== v) {
			return failAt(
				'not_a_number',
				`'${line.slice(s, Math.min(TOK[2 * k + 1], s + 40))}' is not a number`,
				lineNo,
				joined ? 1 : s + 1
			);
		}
		NUMS[k] = v;
	}
	if (st.n >= MAX_SWEEP_POINTS) return failAt('too_many_points', TEXT.tooMany, lineNo, 1);
	const o = st.opt ?? (st.opt = { ...DEFAULT_OPTIONS });
	const fv = NUMS[0];
	const fcol = joined ? 1 : TOK[0] + 1;
	if (!(fv >= 0 && fv * o.mult <= MAX_SWEEP_FREQUENCY_HZ)) {
		return failAt('bad_value', FREQUENCY_RANGE, lineNo, fcol);
	}
	if (fv <= st.prev) {
		return fv === st.prev
			? failAt('duplicate_frequency', TEXT.duplicate, lineNo, fcol)
			: failAt('not_increasing', TEXT.decreasing, lineNo, fcol);
	}
	st.prev = fv;
	// the pair's first number: S11 comes first; S22 last (in Full, Lower and Upper matrices alike)
	const k = st.ports === 2 && st.parameter === 's22' ? st.record - 2 : 1;
	const a = NUMS[k];
	const b = NUMS[k + 1];
	const acol = joined ? 1 : TOK[2 * k] + 1;
	if (o.format === 'ma' && a < 0) {
		return failAt('bad_value', 'magnitude cannot be negative', lineNo, acol);
	}
	const r = k === 1 ? st.refs[0] : (st.refs[1] ?? st.refs[0]);
	pairToGamma(o.format, o.param, a, b, st.version === 2 ? (r ?? o.r) : 1, G);
	const g2 = G.re * G.re + G.im * G.im;
	if (!Number.isFinite(g2)) return failAt('not_passive', TEXT.infinite, lineNo, acol);
	tally(st.far, g2, lineNo, acol);
	const n = st.n++;
	st.f[n] = fv * o.mult;
	st.re[n] = G.re;
	st.im[n] = G.im;
	st.ra[n] = a;
	st.rb[n] = b;
	return null;
}

import type { ReflectionParameter } from './types';
import {
	DEFAULT_OPTIONS,
	decimalNumber,
	failAt,
	type Failure,
	type OptionLine
} from './touchstone-options';
import type { FarTally } from './warnings';

/**
 * Touchstone 2.0 keywords ([Number of Ports], [Reference], [Matrix Format], [Network Data],
 * [Noise Data], [End], …) and the reader's state they set; the data lines are read in
 * touchstone.ts.
 */

const TEXT = {
	twoPortZ:
		'Z-parameters of a 2-port file are not read (S11 needs the whole matrix): export the file as S-parameters',
	version: '[Version] must be the first line of a Touchstone 2.0 file'
};

export interface State {
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

export function setPorts(st: State, ports: number, lineNo: number, column: number): Failure | null {
	if ((st.opt ?? DEFAULT_OPTIONS).param === 'z' && ports === 2) {
		return failAt('unsupported_parameter', TEXT.twoPortZ, lineNo, column);
	}
	st.ports = ports;
	st.record = ports === 1 ? 3 : st.matrix === 'full' ? 9 : 7;
	return null;
}

export function onKeyword(st: State, line: string, p: number, lineNo: number): Failure | null {
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
export function onReference(
	st: State,
	text: string,
	lineNo: number,
	column: number
): Failure | null {
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

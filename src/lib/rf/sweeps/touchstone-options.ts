import { DEG } from '../units/constants';
import { HZ_PER_UNIT } from '../units/frequency';
import { gammaFromImpedance } from './smith';
import { FREQUENCY_UNITS, type SweepErrorCode, type SweepParseError } from './types';
import { FAR_SQ } from './warnings';

/**
 * The Touchstone option line (IBIS Open Forum, Touchstone File Format Specification, Rev 1.1 and
 * Version 2.0): `# <frequency unit> <parameter> <format> R <n>`, fields in any order, each
 * defaulting (GHz, S, MA, R 50). S and Z files are read; a Z file is converted to Γ.
 */

export type Failure = { ok: false; error: SweepParseError };
export type DataFormat = 'ma' | 'db' | 'ri';
export type Parameter = 's' | 'z';

export interface OptionLine {
	mult: number;
	param: Parameter;
	format: DataFormat;
	r: number;
	/** 'R' stood without its value and 50 Ω was taken. */
	rLoose: boolean;
	/** 1-based line of the option line; 0 when the file has none. */
	line: number;
	text: string;
}

export const DEFAULT_OPTIONS: OptionLine = {
	mult: 1e9,
	param: 's',
	format: 'ma',
	r: 50,
	rLoose: false,
	line: 0,
	text: ''
};

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

/** Hz per frequency unit as a file writes it, in any case ('mhz' → 1e6). */
export const UNIT_MULT: Record<string, number> = Object.fromEntries(
	FREQUENCY_UNITS.map((u) => [u.toLowerCase(), HZ_PER_UNIT[u]])
);
const KEYWORDS = /^(hz|khz|mhz|ghz|[syzhg]|ma|db|ri)$/i;

export function parseOptionLine(line: string, lineNo: number): OptionLine | Failure {
	const opt: OptionLine = { ...DEFAULT_OPTIONS, line: lineNo, text: line.trim() };
	const seen = new Set<string>();
	const re = /\S+/g;
	re.lastIndex = line.indexOf('#') + 1;
	let m: RegExpExecArray | null;
	while ((m = re.exec(line))) {
		const tok = m[0].toLowerCase();
		const col = m.index + 1;
		let kind: string;
		if (tok in UNIT_MULT) {
			kind = 'frequency unit';
			opt.mult = UNIT_MULT[tok];
		} else if (tok === 's' || tok === 'z') {
			kind = 'parameter';
			opt.param = tok;
		} else if (tok === 'y') {
			return failAt(
				'unsupported_parameter',
				'Y-parameter files are not read: export S-parameters (S11) or Z-parameters instead',
				lineNo,
				col
			);
		} else if (tok === 'h' || tok === 'g') {
			return failAt(
				'unsupported_parameter',
				`${tok.toUpperCase()}-parameters describe 2-port networks; export S-parameters (S11) instead`,
				lineNo,
				col
			);
		} else if (tok === 'ma' || tok === 'db' || tok === 'ri') {
			kind = 'data format';
			opt.format = tok;
		} else if (tok === 'r') {
			kind = 'reference impedance';
			const at = re.lastIndex;
			const v = re.exec(line);
			if (!v || KEYWORDS.test(v[0])) {
				// 'R' without its value, as some tools write it: the default, with a warning
				opt.rLoose = true;
				re.lastIndex = at;
			} else {
				const r = decimalNumber(v[0]);
				if (!(r > 0)) {
					return failAt(
						'bad_option',
						'R must be followed by a positive reference impedance in ohms',
						lineNo,
						v.index + 1
					);
				}
				opt.r = r;
			}
		} else {
			return failAt(
				'bad_option',
				`unknown option '${m[0]}': the option line reads # <Hz|kHz|MHz|GHz> <S|Z> <DB|MA|RI> R <ohms>`,
				lineNo,
				col
			);
		}
		if (seen.has(kind)) return failAt('bad_option', `the ${kind} is given twice`, lineNo, col);
		seen.add(kind);
	}
	return opt;
}

/** Γ of one data pair, written into `out`; `zScale` divides a Z value into normalized z (1 for Touchstone 1.x, R for 2.0). */
export function pairToGamma(
	format: DataFormat,
	param: Parameter,
	a: number,
	b: number,
	zScale: number,
	out: { re: number; im: number }
): void {
	let x = a;
	let y = b;
	if (format !== 'ri') {
		const mag = format === 'ma' ? a : Math.pow(10, a / 20);
		x = mag * Math.cos(b * DEG);
		y = mag * Math.sin(b * DEG);
	}
	if (param === 'z') {
		const g = gammaFromImpedance(x / zScale, y / zScale);
		x = g.re;
		y = g.im;
	}
	out.re = x;
	out.im = y;
}

const FORMAT_NAME: Record<DataFormat, string> = {
	ma: 'MA (linear magnitude and angle)',
	db: 'DB (dB and angle)',
	ri: 'RI (real and imaginary parts)'
};

/** The likeliest reason a file's pairs are not a passive reflection, as one sentence, or ''. */
export function formatHint(
	opt: OptionLine,
	a: Float64Array,
	b: Float64Array,
	n: number,
	zScale: number
): string {
	const g = { re: 0, im: 0 };
	for (const alt of ['ma', 'db', 'ri'] as const) {
		if (alt === opt.format) continue;
		let passive = 0;
		for (let i = 0; i < n; i++) {
			if (alt === 'ma' && a[i] < 0) continue;
			pairToGamma(alt, opt.param, a[i], b[i], zScale, g);
			if (g.re * g.re + g.im * g.im <= FAR_SQ) passive++;
		}
		if (passive === n) {
			const said = opt.line
				? `line ${opt.line} says ${opt.format.toUpperCase()}`
				: `the file has none, so ${opt.format.toUpperCase()} was assumed`;
			return `Read as ${FORMAT_NAME[alt]}, the same numbers would be a valid reflection: check the format letters on the option line (${said}).`;
		}
	}
	let positive = 0;
	for (let i = 0; i < n; i++) if (a[i] > 0) positive++;
	if (opt.format === 'db' && opt.param === 's' && positive > n / 2) {
		return 'The dB values are positive, as in a gain measurement or a return loss written without its minus sign.';
	}
	return '';
}

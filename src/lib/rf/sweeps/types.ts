/** The shapes every sweep module shares: a sweep, parse options and located parse errors. */
import type { HzUnit } from '../units/frequency';

/**
 * A measured or synthetic 1-port sweep. re/im hold Γ referred to z0: S11, or the S-parameter a
 * 2-port file was read for, or Γ converted from impedance data.
 */
export interface Sweep {
	source: 'touchstone' | 'csv';
	z0: number;
	f_hz: Float64Array;
	re: Float64Array;
	im: Float64Array;
	comments: string[];
	/** false when the data held only a magnitude (VSWR, return loss, |S11|): re = |Γ|, im = 0, no Smith chart. */
	phase_known: boolean;
	version?: 1 | 2;
	/** Ports of the file read (a 2-port gives one reflection parameter). */
	ports?: 1 | 2;
	/** What the reader changed or noticed: conversions, defaults, the parameter used. */
	warnings?: SweepWarning[];
}

export type SweepWarningCode =
	'above_unity' | 'converted_from_z' | 'option_r_without_value' | 'two_port_parameter';

/** One note on a loaded sweep; count, max_excess and frequency_hz are null where they do not apply. */
export interface SweepWarning {
	code: SweepWarningCode;
	message: string;
	/** Points concerned. */
	count: number | null;
	/** Largest |S11| − 1 among them. */
	max_excess: number | null;
	/** Frequency of that largest excess. */
	frequency_hz: number | null;
}

export type SweepErrorCode =
	| 'empty'
	| 'binary'
	| 'no_data'
	| 'too_many_points'
	| 'too_many_ports'
	| 'unsupported_parameter'
	| 'no_such_parameter'
	| 'bad_option'
	| 'option_after_data'
	| 'bad_keyword'
	| 'missing_keyword'
	| 'count_mismatch'
	| 'field_count'
	| 'not_a_number'
	| 'bad_value'
	| 'not_increasing'
	| 'duplicate_frequency'
	| 'not_passive'
	| 'bad_header'
	| 'ambiguous'
	| 'bad_argument';

/** A located parse failure; line and column are 1-based. `choices` lists the answers to an 'ambiguous' question. */
export interface SweepParseError {
	code: SweepErrorCode;
	message: string;
	line?: number;
	column?: number;
	field?: 'format' | 'z0' | 'column' | 'quantity' | 'freq_unit' | 'parameter';
	choices?: string[];
}

export type SweepParseResult = { ok: true; sweep: Sweep } | { ok: false; error: SweepParseError };

export type SweepFormat = 'auto' | 'touchstone' | 'csv';
export type FrequencyUnit = Exclude<HzUnit, 'THz'>;
/** What a single CSV value column holds. */
export type CsvQuantity = 'vswr' | 'rl_db' | 's11_db' | 's11_mag';

/** The reflection parameter read from a 2-port file: port 1 (S11) or port 2 (S22). */
export type ReflectionParameter = 's11' | 's22';

export const FREQUENCY_UNITS: readonly FrequencyUnit[] = ['Hz', 'kHz', 'MHz', 'GHz'];
export const CSV_QUANTITIES: readonly CsvQuantity[] = ['vswr', 'rl_db', 's11_db', 's11_mag'];
export const REFLECTION_PARAMETERS: readonly ReflectionParameter[] = ['s11', 's22'];

export interface ParseSweepOptions {
	format?: SweepFormat;
	/** Reference impedance: labels CSV data; a Touchstone file with another R is renormalized to it. */
	z0?: number;
	/** CSV: the value column to use, by header name or 1-based index. */
	column?: string | number;
	/** CSV: what that column holds, when its header does not say. */
	quantity?: CsvQuantity;
	/** CSV: frequency unit, when the frequency header carries none. */
	freq_unit?: FrequencyUnit;
	/** 2-port Touchstone: which reflection to read; a 1-port file or a CSV has S11 only. */
	parameter?: ReflectionParameter;
}

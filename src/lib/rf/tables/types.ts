/** Shapes of a dimension table definition and of its evaluated result (the API's JSON). */
import type { CatalogueId } from '../catalogues/stock';
import type { LocatedError } from '../formulas/formula';
import type { Units } from '../units/length';
import type { Sensitivity } from './sensitivity';

export type { Units } from '../units/length';

export const ROW_KINDS = ['resonant', 'structural', 'material', 'count'] as const;

type RowKind = (typeof ROW_KINDS)[number];

/**
 * The range of a dimension, as a fraction of a reference, over which the author measured the design:
 * value / of ∈ [min, max]. `of` is 'lambda' (default meaning), 'f', a parameter key or an earlier
 * row key; value and reference must share a dimension. Outside the range the row gets a warning.
 */
export interface ValidRatio {
	of: string;
	min: number;
	max: number;
}

export interface ParameterDef {
	key: string;
	label?: string;
	/** A plain number or a number with a unit, like "1.6 mm" or "14 deg". */
	value: number | string;
	valid_ratio?: ValidRatio;
}

export interface RowDef {
	key: string;
	label?: string;
	formula: string;
	kind: RowKind;
	catalogue?: CatalogueId;
	/** The builder's cutting tolerance, ± mm; compared with the band tolerance of resonant rows. */
	tolerance_mm?: number;
	valid_ratio?: ValidRatio;
}

export interface TableDefinition {
	parameters: ParameterDef[];
	rows: RowDef[];
}

export interface EvaluateOptions {
	frequencyHz: number;
	bandHz?: readonly [number, number];
	units?: Units;
}

interface StockResult {
	catalogue: CatalogueId;
	name: string;
	value_mm: number;
	display: string;
	/** Resonance shift caused by building with the stock size instead of the exact value (resonant rows). */
	shift_hz?: number;
}

export interface RowResult {
	key: string;
	label: string;
	kind: RowKind;
	/** In `unit`: mm or in for lengths, deg for angles, '' for counts and ratios; null on error. */
	value: number | null;
	unit: string;
	value_mm?: number;
	display: string;
	stock?: StockResult;
	sensitivity?: Sensitivity;
	warnings: string[];
	error?: LocatedError;
}

export interface ParameterResult {
	key: string;
	label: string;
	value: number | null;
	unit: string;
	value_mm?: number;
	display: string;
	warnings: string[];
	error?: LocatedError;
}

export interface TableResult {
	frequency_hz: number;
	wavelength_mm: number;
	units: Units;
	band_hz?: [number, number];
	parameters: ParameterResult[];
	rows: RowResult[];
}

/** Thrown for a definition or options no table can be built from (too many rows, bad key, bad f). */
export class TableInputError extends Error {
	constructor(
		message: string,
		readonly field: string
	) {
		super(message);
	}
}

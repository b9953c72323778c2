/** What the formula compiler hands around: a compiled expression and the scope it reads. */
import type { Dims } from './dims';

export type Run = (env: Float64Array) => number;

export interface Compiled {
	dims: Dims;
	run: Run;
	/** Set when the value is known at compile time. */
	k?: number;
}

export interface ScopeEntry {
	slot: number;
	dims: Dims;
}

export interface CompileScope {
	lookup(name: string): ScopeEntry | undefined;
	/** A message for a name that exists but may not be used here (a later row, the row itself). */
	refuse(name: string): string | undefined;
}

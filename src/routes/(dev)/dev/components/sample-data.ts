/** Sample values for the component sheet. Invented demo data, not a design and never a check value. */
import { C } from '$lib/rf/units/constants';
import { formatLength, lengthIn, type Units } from '$lib/rf/units/length';
import { sensitivityFor } from '$lib/rf/tables/sensitivity';
import type { RowResult, TableResult } from '$lib/rf/tables/types';

export interface SampleSweep {
	f_hz: number[];
	vswr: (number | null)[];
	rl_db: (number | null)[];
	re: number[];
	im: number[];
}

/** Series RLC resonator: Z = R + j(ωL − 1/(ωC)), Γ = (Z − 50)/(Z + 50), with Q = ω0 L / R. */
export function resonatorSweep(
	f0: number,
	q: number,
	r: number,
	span: [number, number],
	points: number,
	gap?: [number, number]
): SampleSweep {
	const w0 = 2 * Math.PI * f0;
	const l = (q * r) / w0;
	const c = 1 / (w0 * w0 * l);
	const out: SampleSweep = { f_hz: [], vswr: [], rl_db: [], re: [], im: [] };
	for (let i = 0; i < points; i++) {
		const f = span[0] + ((span[1] - span[0]) * i) / (points - 1);
		const w = 2 * Math.PI * f;
		const x = w * l - 1 / (w * c);
		// (a + jx)/(b + jx) with a = R − 50, b = R + 50
		const a = r - 50;
		const b = r + 50;
		const d = b * b + x * x;
		const gr = (a * b + x * x) / d;
		const gi = (x * b - a * x) / d;
		const m = Math.hypot(gr, gi);
		const missing = gap !== undefined && f >= gap[0] && f <= gap[1];
		out.f_hz.push(f);
		out.re.push(gr);
		out.im.push(gi);
		out.vswr.push(missing ? null : (1 + m) / (1 - m));
		out.rl_db.push(missing ? null : -20 * Math.log10(Math.max(m, 1e-6)));
	}
	return out;
}

interface SampleRow {
	key: string;
	label: string;
	kind: RowResult['kind'];
	/** Fraction of λ, or a fixed length in mm when `fixed_mm` is set. */
	of_lambda?: number;
	fixed_mm?: number;
	count?: number;
	stock?: { name: string; mm: number };
	warning?: string;
	error?: { message: string; column?: number };
}

const ROWS: SampleRow[] = [
	{ key: 'side', label: 'Loop side', kind: 'resonant', of_lambda: 0.25 },
	{
		key: 'spacing',
		label: 'Loop height above reflector',
		kind: 'resonant',
		of_lambda: 0.125,
		stock: { name: 'M3 standoff', mm: 15 }
	},
	{ key: 'reflector', label: 'Reflector width', kind: 'structural', of_lambda: 0.9 },
	{
		key: 'wire_d',
		label: 'Wire diameter',
		kind: 'material',
		fixed_mm: 1.55,
		stock: { name: 'AWG 14', mm: 1.628 },
		warning: 'wire diameter / λ is outside the range the author measured (0.010–0.014 λ)'
	},
	{ key: 'loops', label: 'Number of loops', kind: 'count', count: 2 },
	{
		key: 'feed_gap',
		label: 'Feed gap',
		kind: 'structural',
		error: { message: 'Unknown name "gapp"', column: 9 }
	}
];

/** A dimension table result shaped like the API's, computed from simple fractions of λ. */
export function sampleTable(hz: number, units: Units, band: [number, number] | null): TableResult {
	const lambdaMm = (C / hz) * 1000;
	const rows: RowResult[] = ROWS.map((s) => {
		const base = {
			key: s.key,
			label: s.label,
			kind: s.kind,
			warnings: s.warning ? [s.warning] : []
		};
		if (s.error)
			return {
				...base,
				value: null,
				unit: units === 'mm' ? 'mm' : 'in',
				display: '—',
				error: s.error
			};
		if (s.count !== undefined)
			return { ...base, value: s.count, unit: '', display: String(s.count) };
		const mm = s.fixed_mm ?? (s.of_lambda ?? 0) * lambdaMm;
		const row: RowResult = {
			...base,
			value: lengthIn(mm, units),
			unit: units === 'mm' ? 'mm' : 'in',
			value_mm: mm,
			display: formatLength(mm, units)
		};
		if (s.kind === 'resonant') row.sensitivity = sensitivityFor(hz, mm / 1000, band ?? undefined);
		if (s.stock) {
			row.stock = {
				catalogue: s.kind === 'material' ? 'awg' : 'standoff',
				name: s.stock.name,
				value_mm: s.stock.mm,
				display: formatLength(s.stock.mm, units),
				// Δf/f ≈ −ΔL/L for a resonant row built with the stock size
				shift_hz: s.kind === 'resonant' ? (-hz * (s.stock.mm - mm)) / mm : undefined
			};
		}
		return row;
	});
	return {
		frequency_hz: hz,
		wavelength_mm: lambdaMm,
		units,
		band_hz: band ?? undefined,
		parameters: [],
		rows
	};
}

/** Length display, the one formatter: millimetres, decimal inches (3 places) and fractional inches to 1/64. */
import { MM_PER_INCH } from './constants';

export const UNITS = ['mm', 'in', 'in_frac'] as const;
export type Units = (typeof UNITS)[number];

export function formatMm(mm: number, decimals = 2): string {
	return `${mm.toFixed(decimals)} mm`;
}

export function formatInches(mm: number): string {
	return `${(mm / MM_PER_INCH).toFixed(3)} in`;
}

function gcd(a: number, b: number): number {
	return b === 0 ? a : gcd(b, a % b);
}

/** Nearest 1/64 inch, reduced: `1 15/64 in`, `3/8 in`, `2 in`, `0 in`, `-1 1/4 in`. */
export function formatFractionalInches(mm: number): string {
	const sixtyFourths = Math.round((Math.abs(mm) / MM_PER_INCH) * 64);
	const whole = Math.floor(sixtyFourths / 64);
	const rest = sixtyFourths % 64;
	const sign = mm < 0 && sixtyFourths > 0 ? '-' : '';
	if (rest === 0) return `${sign}${whole} in`;
	const g = gcd(rest, 64);
	const frac = `${rest / g}/${64 / g}`;
	return `${sign}${whole > 0 ? `${whole} ` : ''}${frac} in`;
}

export function formatLength(mm: number, units: Units): string {
	if (units === 'in') return formatInches(mm);
	if (units === 'in_frac') return formatFractionalInches(mm);
	return formatMm(mm);
}

/** The numeric value in the chosen unit (inches for both inch modes). */
export function lengthIn(mm: number, units: Units): number {
	return units === 'mm' ? mm : mm / MM_PER_INCH;
}

/** Display strings shared by the frequency control, the dimension table and the charts. */
import { C } from '../rf/units/constants';

const MINUS = '\u2212';
const THIN_SPACE = '\u2009';

export function wavelengthMm(hz: number): number {
	return (C / hz) * 1000;
}

/** "122.4 mm", "12.49 mm", "22 109 mm": about four significant figures, digits grouped above 1 m. */
export function formatWavelengthMm(mm: number): string {
	if (!Number.isFinite(mm) || mm <= 0) return '—';
	const a = Math.abs(mm);
	if (a >= 1000) {
		const digits = String(Math.round(a));
		return `${digits.replace(/\B(?=(\d{3})+$)/g, THIN_SPACE)} mm`;
	}
	const decimals = a >= 100 ? 1 : a >= 10 ? 2 : 3;
	return `${a.toFixed(decimals)} mm`;
}

/** Signed number with a true minus sign and an explicit plus: "−12.3", "+0.8". Zero is unsigned. */
export function formatSigned(value: number, decimals: number): string {
	const text = Math.abs(value).toFixed(decimals);
	if (Number(text) === 0) return text;
	return `${value < 0 ? MINUS : '+'}${text}`;
}

/** A resonance shift: MHz from 1 MHz up, kHz below, about three significant figures. */
export function formatShift(hz: number): string {
	if (!Number.isFinite(hz)) return '—';
	const useMHz = Math.abs(hz) >= 1e6;
	const v = useMHz ? hz / 1e6 : hz / 1e3;
	const a = Math.abs(v);
	const decimals = a >= 100 ? 0 : a >= 10 ? 1 : 2;
	return `${formatSigned(v, decimals)} ${useMHz ? 'MHz' : 'kHz'}`;
}

/** A ± tolerance to two significant figures: "±0.08 mm", "±1.3 mm", "±12 mm". */
export function formatToleranceMm(mm: number): string {
	if (!Number.isFinite(mm)) return '—';
	return `±${Number(Math.abs(mm).toPrecision(2))} mm`;
}

/** The sweep chart's cursor: which sample a key press moves to, and each series' value there. */
import { clamp, nearestIndex } from './chart-scale';

/** Mean spacing of ascending samples; `fallback` for fewer than two. */
export function sampleSpacing(f: ArrayLike<number>, fallback = 1e6): number {
	return f.length > 1 ? (f[f.length - 1] - f[0]) / (f.length - 1) : fallback;
}

/**
 * The sample index a key press moves the cursor to (`at` is the current or starting index,
 * `showing` whether the cursor is visible); 'hide' for Escape, null for keys the chart ignores.
 * The first arrow press only shows the cursor where it starts.
 */
export function cursorKeyTarget(
	key: string,
	shift: boolean,
	at: number,
	length: number,
	showing: boolean
): number | 'hide' | null {
	if (key === 'Escape') return 'hide';
	if (length === 0) return null;
	const step = shift ? 10 : 1;
	const moves: Record<string, number> = {
		ArrowRight: at + step,
		ArrowUp: at + step,
		ArrowLeft: at - step,
		ArrowDown: at - step,
		PageUp: at + 10,
		PageDown: at - 10,
		Home: 0,
		End: length - 1
	};
	if (!(key in moves)) return null;
	const next = !showing && key.startsWith('Arrow') ? at : moves[key];
	return clamp(next, 0, length - 1);
}

/** The value of the sample nearest `hz` (null where the series holds null), or undefined when `hz` lies more than one spacing outside. */
export function valueNear(
	f: ArrayLike<number>,
	values: ArrayLike<number | null>,
	hz: number,
	spacing: number
): number | null | undefined {
	const i = nearestIndex(f, hz);
	if (i < 0 || hz < f[0] - spacing || hz > f[f.length - 1] + spacing) return undefined;
	return values[i] ?? null;
}

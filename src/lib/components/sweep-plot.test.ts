import { describe, expect, it } from 'vitest';
import {
	bestPoint,
	densestSeries,
	formatSweepValue,
	frequencyExtent,
	linePath,
	spreadLabels,
	valueAxisTop
} from './sweep-plot';

const id = (v: number) => v;

describe('linePath', () => {
	it('breaks the line at null values', () => {
		const d = linePath([1, 2, 3, 4, 5], [1, 2, null, 4, 5], id, id);
		expect(d).toBe('M1.0,1.0 L2.0,2.0 M4.0,4.0 L5.0,5.0');
	});

	it('draws a lone point between gaps as a zero-length segment', () => {
		const d = linePath([1, 2, 3], [null, 2, Number.NaN], id, id);
		expect(d).toBe('M2.0,2.0 h0');
	});

	it('draws null at nullAt when given (an infinite VSWR at the top edge)', () => {
		const d = linePath([1, 2, 3], [1, null, 3], id, id, 9);
		expect(d).toBe('M1.0,1.0 L2.0,9.0 L3.0,3.0');
	});
});

describe('bestPoint', () => {
	it('finds the lowest VSWR and the highest return loss', () => {
		const f = [10, 20, 30, 40];
		expect(bestPoint(f, [3, 1.2, null, 1.5], 'vswr')).toEqual({ f_hz: 20, value: 1.2 });
		expect(bestPoint(f, [6, 9, 21, null], 'rl_db')).toEqual({ f_hz: 30, value: 21 });
		expect(bestPoint(f, [null, null, null, null], 'vswr')).toBeNull();
	});
});

describe('valueAxisTop and formatting', () => {
	it('keeps VSWR at 5 unless the ceiling needs more room', () => {
		expect(valueAxisTop('vswr', [], 2)).toBe(5);
		expect(valueAxisTop('vswr', [], 6)).toBe(7);
	});

	it('rounds the return loss axis up to a multiple of 10, at least 20 dB', () => {
		// [calc] max 27.3 dB + 2 dB headroom → 29.3 → 30
		const s = [{ label: 'a', f_hz: [1, 2], values: [27.3, 5] }];
		expect(valueAxisTop('rl_db', s)).toBe(30);
		expect(valueAxisTop('rl_db', [], 9.54)).toBe(20);
	});

	it('prints values for the read-out', () => {
		expect(formatSweepValue(1.234, 'vswr')).toBe('1.23');
		expect(formatSweepValue(14.26, 'vswr')).toBe('14.3');
		expect(formatSweepValue(19.08, 'rl_db')).toBe('19.1 dB');
		expect(formatSweepValue(null, 'vswr')).toBe('off scale'); // |S11| ≥ 1: infinite VSWR
		expect(formatSweepValue(undefined, 'vswr')).toBe('—'); // no sample there
		expect(formatSweepValue(null, 'rl_db')).toBe('—');
	});
});

describe('spreadLabels', () => {
	it('steps a crowded label away and leaves distant ones alone', () => {
		// labels 12 px tall: the second sits 10 px right of the first, so it moves to 12 px above it
		const ys = spreadLabels(
			[
				{ x: 100, y: 50 },
				{ x: 110, y: 52 },
				{ x: 300, y: 50 }
			],
			36,
			12,
			-1
		);
		expect(ys).toEqual([50, 38, 50]);
	});

	it('keeps stepping until clear, in x order whatever the input order', () => {
		const ys = spreadLabels(
			[
				{ x: 20, y: 10 },
				{ x: 10, y: 10 },
				{ x: 0, y: 10 }
			],
			36,
			12,
			1
		);
		expect(ys).toEqual([34, 22, 10]);
	});
});

describe('frequencyExtent and densestSeries', () => {
	const a = { label: 'a', f_hz: [2, 3, 4], values: [1, 1, 1] };
	const b = { label: 'b', f_hz: [1, Number.NaN, 5, 6], values: [1, 1, 1, 1] };

	it('spans every series and skips non-finite frequencies', () => {
		expect(frequencyExtent([a, b])).toEqual([1, 6]);
		expect(frequencyExtent([])).toBeNull();
	});

	it('picks the series with the most points', () => {
		expect(densestSeries([a, b])?.label).toBe('b');
		expect(densestSeries([{ label: 'e', f_hz: [], values: [] }])).toBeNull();
	});
});

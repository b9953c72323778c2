import { describe, expect, it } from 'vitest';
import { downsampleMinMax } from './downsample';
import { seededRandom } from './synthetic';

describe('downsampleMinMax', () => {
	it('keeps every point of a short series', () => {
		expect(downsampleMinMax([3, 1, 2], 2000)).toEqual([0, 1, 2]);
	});

	it('keeps the global minimum, the ends, ascending order, and at most 2000 points', () => {
		for (const [n, seed] of [
			[2001, 1],
			[100_000, 2],
			[200_000, 3],
			[7919, 4]
		]) {
			const rand = seededRandom(seed);
			const v = Array.from({ length: n }, () => 1.2 + rand() * 5);
			const minAt = Math.floor(rand() * n);
			v[minAt] = 1.01;
			const idx = downsampleMinMax(v, 2000);
			expect(idx.length).toBeLessThanOrEqual(2000);
			expect(idx).toContain(minAt);
			expect(idx[0]).toBe(0);
			expect(idx[idx.length - 1]).toBe(n - 1);
			for (let i = 1; i < idx.length; i++) expect(idx[i]).toBeGreaterThan(idx[i - 1]);
		}
	});

	it('keeps a minimum sitting at either end', () => {
		const v = Array.from({ length: 5000 }, (_, i) => 2 + Math.sin(i));
		v[0] = 1;
		expect(downsampleMinMax(v, 100)).toContain(0);
		v[0] = 2;
		v[4999] = 1;
		expect(downsampleMinMax(v, 100)).toContain(4999);
	});

	it('refuses a budget too small to keep ends and extremes', () => {
		expect(() => downsampleMinMax([1, 2, 3, 4, 5], 3)).toThrow(RangeError);
	});
});

import { describe, expect, it } from 'vitest';
import { cursorKeyTarget, sampleSpacing, valueNear } from './sweep-cursor';

describe('cursorKeyTarget', () => {
	it('moves one sample per arrow, ten with Shift, and stops at the ends', () => {
		expect(cursorKeyTarget('ArrowRight', false, 5, 100, true)).toBe(6);
		expect(cursorKeyTarget('ArrowLeft', true, 5, 100, true)).toBe(0);
		expect(cursorKeyTarget('ArrowUp', true, 95, 100, true)).toBe(99);
		expect(cursorKeyTarget('End', false, 5, 100, true)).toBe(99);
		expect(cursorKeyTarget('Home', false, 5, 100, false)).toBe(0);
	});

	it('shows the cursor in place on the first arrow press', () => {
		expect(cursorKeyTarget('ArrowRight', false, 40, 100, false)).toBe(40);
	});

	it('hides on Escape and ignores other keys', () => {
		expect(cursorKeyTarget('Escape', false, 5, 100, true)).toBe('hide');
		expect(cursorKeyTarget('a', false, 5, 100, true)).toBeNull();
		expect(cursorKeyTarget('ArrowRight', false, 0, 0, true)).toBeNull();
	});
});

describe('valueNear and sampleSpacing', () => {
	const f = [100, 110, 120];
	const v = [3, null, 1.5];

	it('reads the nearest sample, null at a gap or outside the sweep', () => {
		expect(valueNear(f, v, 118, 10)).toBe(1.5);
		expect(valueNear(f, v, 109, 10)).toBeNull();
		expect(valueNear(f, v, 95, 10)).toBe(3);
		expect(valueNear(f, v, 200, 10)).toBeUndefined();
	});

	it('averages the spacing', () => {
		// [calc] (120 − 100) / 2 = 10
		expect(sampleSpacing(f)).toBe(10);
		expect(sampleSpacing([5], 7)).toBe(7);
	});
});

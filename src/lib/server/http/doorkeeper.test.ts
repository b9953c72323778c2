import { describe, expect, it } from 'vitest';
import { Doorkeeper } from './doorkeeper';

describe('Doorkeeper', () => {
	it('says a key was seen only from its second time on', () => {
		const d = new Doorkeeper(10);
		expect(d.seen('5.8 GHz')).toBe(false);
		expect(d.seen('5.8 GHz')).toBe(true);
		expect(d.seen('2.4 GHz')).toBe(false);
	});

	it('forgets keys after two generations of other keys, and keeps recent ones across one', () => {
		const d = new Doorkeeper(4);
		d.seen('old');
		for (let i = 0; i < 3; i++) d.seen(`a${i}`); // 'old' moves to the previous generation
		expect(d.seen('a0')).toBe(true);
		d.seen('old-again');
		for (let i = 0; i < 8; i++) d.seen(`b${i}`); // two more generations
		expect(d.seen('old')).toBe(false);
	});
});

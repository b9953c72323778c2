import { describe, expect, it } from 'vitest';
import { Doorkeeper, Lru } from './lru';

describe('Lru', () => {
	it('drops the least recently used entry beyond its capacity', () => {
		const lru = new Lru<string, number>(2);
		lru.set('a', 1);
		lru.set('b', 2);
		expect(lru.get('a')).toBe(1); // a is now newer than b
		lru.set('c', 3);
		expect(lru.get('b')).toBeUndefined();
		expect(lru.get('a')).toBe(1);
		expect(lru.get('c')).toBe(3);
	});
});

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

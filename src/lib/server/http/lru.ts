/** A small least-recently-used cache for values derived from immutable rows. */
export class Lru<K, V> {
	#map = new Map<K, V>();
	constructor(readonly capacity: number) {}

	get(key: K): V | undefined {
		const v = this.#map.get(key);
		if (v !== undefined) {
			this.#map.delete(key);
			this.#map.set(key, v);
		}
		return v;
	}

	set(key: K, value: V): void {
		this.#map.delete(key);
		this.#map.set(key, value);
		if (this.#map.size > this.capacity) this.#map.delete(this.#map.keys().next().value as K);
	}

	delete(key: K): void {
		this.#map.delete(key);
	}
}

/**
 * Which keys were asked for lately, for caches that keep a value only when its key comes back: a
 * one-off request (a frequency typed once) then costs no memory and pushes out nothing readers
 * reuse. Holds between `capacity` and twice that many keys, in two generations.
 */
export class Doorkeeper {
	#current = new Set<string>();
	#previous = new Set<string>();
	constructor(readonly capacity: number) {}

	/** True when `key` was asked for before (and not long ago); remembers it either way. */
	seen(key: string): boolean {
		const before = this.#current.has(key) || this.#previous.has(key);
		this.#current.add(key);
		if (this.#current.size >= this.capacity) {
			this.#previous = this.#current;
			this.#current = new Set();
		}
		return before;
	}
}

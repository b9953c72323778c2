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

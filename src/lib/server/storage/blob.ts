/** What every store shares: the BlobStore contract, key and input checks, fresh keys. */
import { randomBytes } from 'node:crypto';

export interface BlobStore {
	/** Store bytes under key, replacing any earlier blob with that key. */
	put(key: string, bytes: Uint8Array, contentType: string): Promise<void>;
	/** The bytes stored under key, or null when there are none. */
	get(key: string): Promise<Uint8Array | null>;
	/** Remove the blob; removing a missing key is not an error. */
	delete(key: string): Promise<void>;
	/** The name of every blob held (for the start-up sweep); names need not be keys of ours. */
	list(): AsyncIterable<string>;
	/** Removes what writes cut short left behind; their names, relative to the store. */
	removeTemporary(): Promise<string[]>;
}

export type BlobField = 'key' | 'prefix' | 'bytes' | 'contentType';

/** A key, prefix, byte array or content type is unusable; nothing was stored. */
export class BlobInputError extends Error {
	readonly field: BlobField;
	constructor(field: BlobField, problem: string) {
		super(`Blob ${field} ${problem}`);
		this.name = 'BlobInputError';
		this.field = field;
	}
}

/** Allowed characters in a blob key. No dots, so no `..` and no file extensions. */
export const BLOB_KEY = /^[a-z0-9/_-]+$/;
const SEGMENTS = /^[a-z0-9_-]+(?:\/[a-z0-9_-]+)*$/;
const MAX_KEY = 512;
// RFC 6838 §4.2 restricted names, with an optional single parameter such as charset.
const CONTENT_TYPE =
	/^[a-z0-9][a-z0-9!#$&^_.+-]{0,126}\/[a-z0-9][a-z0-9!#$&^_.+-]{0,126}(?:; ?[a-z0-9-]+=[a-z0-9-]+)?$/i;

export function checkBlobKey(key: unknown, field: 'key' | 'prefix' = 'key'): string {
	if (typeof key !== 'string') throw new BlobInputError(field, 'must be a string');
	if (key.length === 0 || key.length > MAX_KEY) {
		throw new BlobInputError(field, `must be 1 to ${MAX_KEY} characters`);
	}
	if (!BLOB_KEY.test(key)) {
		throw new BlobInputError(field, 'may contain only a-z, 0-9, "/", "_" and "-"');
	}
	if (!SEGMENTS.test(key)) {
		throw new BlobInputError(field, 'must not start or end with "/" or contain "//"');
	}
	return key;
}

export function checkBlobInput(bytes: unknown, contentType: unknown): void {
	if (!(bytes instanceof Uint8Array)) throw new BlobInputError('bytes', 'must be a Uint8Array');
	if (typeof contentType !== 'string' || !CONTENT_TYPE.test(contentType)) {
		throw new BlobInputError('contentType', 'must be a media type such as "image/webp"');
	}
}

const BASE32 = 'abcdefghijklmnopqrstuvwxyz234567';

/** RFC 4648 §6 base32, lower case, without padding. */
export function base32(bytes: Uint8Array): string {
	let out = '';
	let buffer = 0;
	let bits = 0;
	for (const byte of bytes) {
		buffer = (buffer << 8) | byte;
		bits += 8;
		while (bits >= 5) {
			out += BASE32[(buffer >>> (bits - 5)) & 31];
			bits -= 5;
		}
	}
	if (bits > 0) out += BASE32[(buffer << (5 - bits)) & 31];
	return out;
}

/**
 * A fresh key `prefix/yyyy/mm/<32 base32 chars>` (160 random bits, UTC month). Keys are always
 * generated here, never taken from a user.
 * @throws BlobInputError when prefix is not made of valid key segments
 */
export function newBlobKey(prefix: string, now = new Date()): string {
	checkBlobKey(prefix, 'prefix');
	const yyyy = String(now.getUTCFullYear()).padStart(4, '0');
	const mm = String(now.getUTCMonth() + 1).padStart(2, '0');
	return checkBlobKey(`${prefix}/${yyyy}/${mm}/${base32(randomBytes(20))}`);
}

/** Whether a name has the shape newBlobKey gives: `prefix/yyyy/mm/<32 base32 chars>`. */
export const isGeneratedKey = (name: string) =>
	/^[a-z0-9_-]+\/\d{4}\/\d{2}\/[a-z2-7]{32}$/.test(name);

import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { base32, BLOB_KEY, BlobInputError, checkBlobKey, newBlobKey } from './blob';
import { createStore } from './index';

describe('base32', () => {
	it.each([
		// RFC 4648 §10 test vectors, lower-cased and without padding
		['', ''],
		['f', 'my'],
		['fo', 'mzxq'],
		['foo', 'mzxw6'],
		['foob', 'mzxw6yq'],
		['fooba', 'mzxw6ytb'],
		['foobar', 'mzxw6ytboi']
	])('encodes %j as %j', (input, expected) => {
		expect(base32(new TextEncoder().encode(input))).toBe(expected);
	});
});

describe('newBlobKey', () => {
	it('builds prefix/yyyy/mm/<32 base32 characters> from the UTC date', () => {
		// 2026-01-31T23:30 at UTC-5 is already February in UTC
		const key = newBlobKey('photos', new Date('2026-01-31T23:30:00-05:00'));
		expect(key).toMatch(/^photos\/2026\/02\/[a-z2-7]{32}$/);
		expect(key).toMatch(BLOB_KEY);
	});

	it('accepts a nested prefix and gives a different key each call', () => {
		const keys = new Set(Array.from({ length: 50 }, () => newBlobKey('sweeps/raw')));
		expect(keys.size).toBe(50);
		for (const k of keys) expect(k.startsWith('sweeps/raw/')).toBe(true);
	});

	it.each(['', '/photos', 'photos/', 'Photos', 'a//b', '../x', 'a.b', 'a b'])(
		'rejects prefix %j',
		(prefix) => {
			expect(() => newBlobKey(prefix)).toThrow(BlobInputError);
			expect(() => newBlobKey(prefix)).toThrow(/^Blob prefix /);
		}
	);
});

describe('checkBlobKey', () => {
	it('accepts a generated key', () => {
		const key = newBlobKey('attachments');
		expect(checkBlobKey(key)).toBe(key);
	});

	it.each([
		['../etc/passwd', 'may contain only'],
		['a/../../b', 'may contain only'],
		['/abs/path', 'must not start or end'],
		['a//b', 'must not start or end'],
		['a/', 'must not start or end'],
		['a\\b', 'may contain only'],
		['a\0b', 'may contain only'],
		['photo.jpg', 'may contain only'],
		['UPPER', 'may contain only'],
		['', 'must be 1 to 512'],
		['a'.repeat(513), 'must be 1 to 512']
	])('rejects %j', (key, problem) => {
		expect(() => checkBlobKey(key)).toThrow(BlobInputError);
		expect(() => checkBlobKey(key)).toThrow(problem);
	});

	it('rejects a non-string with a typed error', () => {
		expect(() => checkBlobKey(42)).toThrow(BlobInputError);
	});
});

describe('createStore', () => {
	it('gives a working local store', async () => {
		const dir = await mkdtemp(path.join(tmpdir(), 'bw-store-'));
		try {
			const store = createStore({ driver: 'local', dir });
			const key = newBlobKey('t');
			await store.put(key, Uint8Array.of(1, 2, 3), 'application/octet-stream');
			expect(await store.get(key)).toEqual(Uint8Array.of(1, 2, 3));
		} finally {
			await rm(dir, { recursive: true, force: true });
		}
	});

	it('rejects an unknown driver', () => {
		expect(() => createStore({ driver: 'ftp' } as never)).toThrow('Unknown storage driver "ftp"');
	});

	it('rejects an s3 configuration without credentials before any network use', () => {
		expect(() =>
			createStore({ driver: 's3', bucket: 'b', region: 'r', accessKeyId: '', secretAccessKey: 's' })
		).toThrow('S3 storage needs "accessKeyId"');
	});
});

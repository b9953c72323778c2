import { mkdtemp, readdir, readFile, rm, stat, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { BlobInputError, newBlobKey } from './blob';
import { createLocalStore } from './local';

let root: string;
let dir: string;
beforeEach(async () => {
	root = await mkdtemp(path.join(tmpdir(), 'bw-local-'));
	dir = path.join(root, 'blobs');
});
afterEach(async () => {
	await rm(root, { recursive: true, force: true });
});

/** Every file under d, relative, sorted. */
async function tree(d: string): Promise<string[]> {
	const entries = await readdir(d, { recursive: true, withFileTypes: true });
	return entries
		.filter((e) => e.isFile())
		.map((e) => path.relative(d, path.join(e.parentPath, e.name)))
		.sort();
}

describe('local store', () => {
	it('puts, gets and deletes a blob as a file at the key path', async () => {
		const store = createLocalStore(dir);
		const key = newBlobKey('photos');
		const bytes = new TextEncoder().encode('fake image bytes');
		await store.put(key, bytes, 'image/webp');
		expect(await tree(dir)).toEqual([key]);
		expect(new Uint8Array(await readFile(path.join(dir, key)))).toEqual(bytes);
		expect(await store.get(key)).toEqual(bytes);
		await store.delete(key);
		expect(await store.get(key)).toBeNull();
		expect(await tree(dir)).toEqual([]);
	});

	it('returns null for a missing key, and for a key that is only a directory', async () => {
		const store = createLocalStore(dir);
		await store.put('a/b/c', Uint8Array.of(1), 'application/octet-stream');
		expect(await store.get('a/b/missing')).toBeNull();
		expect(await store.get('a/b')).toBeNull();
		expect(await store.get('a/b/c/d')).toBeNull();
		expect(await store.get('never/was')).toBeNull();
	});

	it('deleting a missing key is not an error', async () => {
		const store = createLocalStore(dir);
		await expect(store.delete('nothing/here')).resolves.toBeUndefined();
		await store.put('x/y', Uint8Array.of(1), 'text/plain');
		await expect(store.delete('x')).resolves.toBeUndefined();
		expect(await store.get('x/y')).toEqual(Uint8Array.of(1));
	});

	it('replaces a blob whole and leaves no temporary files', async () => {
		const store = createLocalStore(dir);
		await store.put('k', new Uint8Array(1000).fill(7), 'application/octet-stream');
		await store.put('k', Uint8Array.of(9, 9), 'application/octet-stream');
		expect(await store.get('k')).toEqual(Uint8Array.of(9, 9));
		expect(await tree(dir)).toEqual(['k']);
	});

	it('stores an empty blob and binary bytes unchanged', async () => {
		const store = createLocalStore(dir);
		const all = Uint8Array.from({ length: 256 }, (_, i) => i);
		await store.put('bin', all, 'application/octet-stream');
		await store.put('empty', new Uint8Array(0), 'application/octet-stream');
		expect(await store.get('bin')).toEqual(all);
		expect(await store.get('empty')).toEqual(new Uint8Array(0));
	});

	it('writes files that only the owner and group can read', async () => {
		const store = createLocalStore(dir);
		await store.put('p', Uint8Array.of(1), 'text/plain');
		expect((await stat(path.join(dir, 'p'))).mode & 0o007).toBe(0);
	});

	it.each(['../outside', 'a/../../outside', '/etc/passwd', 'a/./b', '..', 'a\\..\\b'])(
		'rejects traversal key %j on put, get and delete and touches nothing',
		async (key) => {
			const store = createLocalStore(dir);
			await writeFile(path.join(root, 'outside'), 'secret');
			await expect(store.put(key, Uint8Array.of(1), 'text/plain')).rejects.toThrow(BlobInputError);
			await expect(store.get(key)).rejects.toThrow(BlobInputError);
			await expect(store.delete(key)).rejects.toThrow(BlobInputError);
			expect(await readFile(path.join(root, 'outside'), 'utf8')).toBe('secret');
			expect(await tree(root)).toEqual(['outside']);
		}
	);

	it('rejects bytes that are not a Uint8Array and a bad content type', async () => {
		const store = createLocalStore(dir);
		await expect(store.put('k', 'text' as never, 'text/plain')).rejects.toMatchObject({
			field: 'bytes'
		});
		await expect(store.put('k', Uint8Array.of(1), 'text/plain\r\nX-Evil: 1')).rejects.toMatchObject(
			{
				field: 'contentType'
			}
		);
		await expect(store.put('k', Uint8Array.of(1), '')).rejects.toMatchObject({
			field: 'contentType'
		});
		await expect(readdir(root)).resolves.toEqual([]);
	});

	it('surfaces a real file-system error instead of hiding it', async () => {
		const store = createLocalStore(dir);
		await store.put('a', Uint8Array.of(1), 'text/plain');
		// 'a' is a file, so 'a/b' cannot be created under it
		await expect(store.put('a/b', Uint8Array.of(2), 'text/plain')).rejects.toMatchObject({
			code: expect.stringMatching(/^(EEXIST|ENOTDIR)$/)
		});
		expect(await store.get('a')).toEqual(Uint8Array.of(1));
	});

	it('keeps many concurrent writes to distinct keys intact', async () => {
		const store = createLocalStore(dir);
		const keys = Array.from({ length: 40 }, () => newBlobKey('c'));
		await Promise.all(keys.map((k, i) => store.put(k, Uint8Array.of(i), 'text/plain')));
		const got = await Promise.all(keys.map((k) => store.get(k)));
		expect(got).toEqual(keys.map((_, i) => Uint8Array.of(i)));
	});
});

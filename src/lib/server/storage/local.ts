import { randomBytes } from 'node:crypto';
import { mkdir, open, readdir, readFile, rename, unlink } from 'node:fs/promises';
import path from 'node:path';
import { BlobInputError, checkBlobInput, checkBlobKey, type BlobStore } from './blob';

// "no blob under this key", whatever the shape of the tree around it
const ABSENT = new Set(['ENOENT', 'ENOTDIR', 'EISDIR']);

const code = (e: unknown) => (e as NodeJS.ErrnoException | null)?.code ?? '';

/** Blobs as files under dir, one file per key; writes appear whole or not at all. */
export function createLocalStore(dir: string): BlobStore {
	if (typeof dir !== 'string' || dir === '') throw new Error('Local storage needs a directory');
	const root = path.resolve(dir);

	function fileFor(key: string): string {
		checkBlobKey(key);
		const file = path.resolve(root, ...key.split('/'));
		// The key pattern already rules out traversal; this guards against a future change to it.
		if (!file.startsWith(root + path.sep)) {
			throw new BlobInputError('key', 'points outside the storage directory');
		}
		return file;
	}

	/** Every file under the root, as "/"-separated paths relative to it. */
	async function files(): Promise<string[]> {
		try {
			const entries = await readdir(root, { recursive: true, withFileTypes: true });
			return entries
				.filter((e) => e.isFile())
				.map((e) => path.relative(root, path.join(e.parentPath, e.name)).split(path.sep).join('/'));
		} catch (e) {
			if (code(e) === 'ENOENT') return [];
			throw e;
		}
	}
	const isTemporary = (name: string) => name.endsWith('.tmp');

	return {
		async put(key, bytes, contentType) {
			const file = fileFor(key);
			checkBlobInput(bytes, contentType);
			await mkdir(path.dirname(file), { recursive: true });
			// The dot keeps temporary names out of the key space.
			const tmp = `${file}.${randomBytes(6).toString('hex')}.tmp`;
			const handle = await open(tmp, 'wx', 0o640);
			try {
				await handle.writeFile(bytes);
				await handle.sync();
			} catch (e) {
				await handle.close();
				await unlink(tmp).catch(() => undefined);
				throw e;
			}
			await handle.close();
			try {
				await rename(tmp, file);
			} catch (e) {
				await unlink(tmp).catch(() => undefined);
				throw e;
			}
		},

		async get(key) {
			const file = fileFor(key);
			try {
				const buf = await readFile(file);
				return new Uint8Array(buf.buffer, buf.byteOffset, buf.byteLength);
			} catch (e) {
				if (ABSENT.has(code(e))) return null;
				throw e;
			}
		},

		async delete(key) {
			const file = fileFor(key);
			try {
				await unlink(file);
			} catch (e) {
				if (!ABSENT.has(code(e))) throw e;
			}
		},

		async *list() {
			for (const name of await files()) if (!isTemporary(name)) yield name;
		},

		async removeTemporary() {
			const removed: string[] = [];
			for (const name of (await files()).filter(isTemporary)) {
				await unlink(path.join(root, ...name.split('/'))).catch((e) => {
					if (!ABSENT.has(code(e))) throw e;
				});
				removed.push(name);
			}
			return removed;
		}
	};
}

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdir, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { addAttachment } from '../measurements/attachments';
import { blobKeysInUse } from '../measurements/blob-keys';
import { sweepStore } from './sweep';
import { solidPng } from '../../testing/upload-fixtures';
import { designAt, member, tempStore, type TempStore } from '../../testing/server-setup';

let temp: TempStore;
beforeAll(async () => {
	temp = await tempStore();
});
afterAll(() => temp.cleanup());

describe('the start-up sweep of the blob store', () => {
	it('removes temporary files and blobs without a row, logs them, and keeps every blob a row names', async () => {
		const author = await member('sweep-author@example.org');
		const r = designAt(author, 'Sweep test design', 2.45e9, [2.4e9, 2.5e9]);
		await addAttachment(author, r, {
			fields: { caption: 'kept' },
			file: { bytes: await solidPng(64, 48), name: 'kept.png' }
		});
		const kept = (await temp.files()).sort();
		expect(kept).toHaveLength(2); // display copy and thumbnail

		// What a kill leaves: a write cut before its rename, and a blob whose row never committed.
		const orphan = `images/2026/01/${'a'.repeat(32)}`;
		await temp.store.put(orphan, Uint8Array.of(1, 2, 3), 'image/webp');
		await mkdir(path.join(temp.dir, 'sweeps', '2026', '02'), { recursive: true });
		const tmp = path.join('sweeps', '2026', '02', `${'b'.repeat(32)}.0123456789ab.tmp`);
		await writeFile(path.join(temp.dir, tmp), 'half a file');
		// Not a key this app makes: never touched.
		await writeFile(path.join(temp.dir, 'README'), 'placed by the operator');

		const lines: string[] = [];
		const result = await sweepStore(blobKeysInUse, { log: (line) => lines.push(line) });
		expect(result).toEqual({ temporary: [tmp.split(path.sep).join('/')], orphans: [orphan] });
		expect((await temp.files()).sort()).toEqual([...kept, 'README'].sort());
		expect(lines.join('\n')).toMatch(/removed 1 temporary file and 1 orphan blob/);

		// A clean store: nothing to do, nothing logged.
		lines.length = 0;
		expect(await sweepStore(blobKeysInUse, { log: (line) => lines.push(line) })).toEqual({
			temporary: [],
			orphans: []
		});
		expect(lines).toEqual([]);
	});
});

/**
 * The start-up sweep of the blob store. A blob is written before its row commits, through a
 * temporary file renamed into place (local store); a crash in between leaves a temporary file, or a
 * blob no row names. At start nothing is being written, so both can go. Only names of the shape
 * this app gives keys are considered: anything else in the store is left alone.
 */
import { db } from './db';
import { attachments, measurements } from './db/schema';
import { blobStore } from './files';
import type { BlobStore } from './storage';

const OUR_KEY = /^(images|sweeps)\/\d{4}\/\d{2}\/[a-z2-7]{32}$/;

function referencedKeys(): Set<string> {
	const keys = new Set<string>();
	for (const a of db
		.select({ d: attachments.displayKey, t: attachments.thumbKey, o: attachments.originalKey })
		.from(attachments)
		.all()) {
		keys.add(a.d).add(a.t);
		if (a.o) keys.add(a.o);
	}
	for (const m of db.select({ k: measurements.fileKey }).from(measurements).all()) keys.add(m.k);
	return keys;
}

export async function sweepStore({
	store = blobStore(),
	log = (line: string) => console.warn(line)
}: { store?: BlobStore; log?: (line: string) => void } = {}): Promise<{
	temporary: string[];
	orphans: string[];
}> {
	const temporary = await store.removeTemporary();
	const referenced = referencedKeys();
	const orphans: string[] = [];
	for await (const key of store.list()) {
		if (OUR_KEY.test(key) && !referenced.has(key)) orphans.push(key);
	}
	for (const key of orphans) await store.delete(key);
	if (temporary.length || orphans.length) {
		log(
			`storage sweep: removed ${temporary.length} temporary file${temporary.length === 1 ? '' : 's'} ` +
				`and ${orphans.length} orphan blob${orphans.length === 1 ? '' : 's'} (no row names them), left by an interrupted upload: ` +
				[...temporary, ...orphans].join(', ')
		);
	}
	return { temporary, orphans };
}

/**
 * The start-up sweep of the blob store. A blob is written before its row commits, through a
 * temporary file renamed into place (local store); a crash in between leaves a temporary file, or a
 * blob no row names. At start nothing is being written, so both can go. Only names of the shape
 * newBlobKey gives are considered: anything else in the store is left alone.
 */
import { isGeneratedKey, type BlobStore } from './blob';
import { blobStore } from './from-env';

export async function sweepStore(
	/** Every key a row names (read after the temporary files are gone). */
	keysInUse: () => ReadonlySet<string>,
	{
		store = blobStore(),
		log = (line: string) => console.warn(line)
	}: { store?: BlobStore; log?: (line: string) => void } = {}
): Promise<{ temporary: string[]; orphans: string[] }> {
	const temporary = await store.removeTemporary();
	const referenced = keysInUse();
	const orphans: string[] = [];
	for await (const key of store.list()) {
		if (isGeneratedKey(key) && !referenced.has(key)) orphans.push(key);
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

/** Every blob key a row names: sweep files, and each photo's copies. The start-up sweep keeps these. */
import { db } from '../db';
import { attachments, measurements } from '../db/schema';

export function blobKeysInUse(): Set<string> {
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

// Shared set-up for the upload unit tests: verified members, a design, a temporary blob store.
import { mkdtemp, readdir, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { count, eq } from 'drizzle-orm';
import { createAccount } from '../server/accounts/accounts';
import { toSessionUser, type SessionUser } from '../server/accounts/auth';
import { db } from '../server/db';
import { attachments, measurements, users, type Revision } from '../server/db/schema';
import { createDesign, starterContent } from '../server/designs/designs';
import { submitRevision } from '../server/designs/revisions';
import { getRevisionById } from '../server/designs/lookups';
import { useBlobStore } from '../server/storage/from-env';
import { createStore } from '../server/storage';
import type { BlobStore } from '../server/storage/blob';

export async function member(email: string, verified = true): Promise<SessionUser> {
	const a = (await createAccount({
		email,
		displayName: email.split('@')[0],
		password: 'long enough pass'
	}))!;
	if (verified)
		db.update(users).set({ emailVerifiedAt: new Date() }).where(eq(users.id, a.id)).run();
	return toSessionUser(db.select().from(users).where(eq(users.id, a.id)).get()!);
}

/** A design at hz claiming VSWR ≤ 2 over band; r1 submitted unless asked to stay a draft. */
export function designAt(
	author: SessionUser,
	title: string,
	hz: number,
	band: [number, number],
	submit = true
): Revision {
	const content = {
		...starterContent(hz),
		claim: { centre_hz: hz, band_lo_hz: band[0], band_hi_hz: band[1], vswr_max: 2 }
	};
	const { revisionId } = createDesign(
		author,
		{ title, family: 'biquad', polarization: 'linear', summary: 'Upload test design.' },
		content
	);
	if (submit) submitRevision(author, revisionId);
	return getRevisionById(revisionId)!;
}

export interface TempStore {
	dir: string;
	store: BlobStore;
	files(): Promise<string[]>;
	cleanup(): Promise<void>;
}

/** A local store in a fresh temporary folder, installed as the process store. */
export async function tempStore(): Promise<TempStore> {
	const dir = await mkdtemp(path.join(tmpdir(), 'bw-uploads-'));
	const store = createStore({ driver: 'local', dir });
	useBlobStore(store);
	return {
		dir,
		store,
		async files() {
			const entries = await readdir(dir, { recursive: true, withFileTypes: true });
			return entries
				.filter((e) => e.isFile())
				.map((e) => path.relative(dir, path.join(e.parentPath, e.name)));
		},
		async cleanup() {
			useBlobStore(null);
			await rm(dir, { recursive: true, force: true });
		}
	};
}

export const rowCounts = () => ({
	measurements: db.select({ n: count() }).from(measurements).get()!.n,
	attachments: db.select({ n: count() }).from(attachments).get()!.n
});

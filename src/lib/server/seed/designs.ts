// Demo designs: content/designs/<slug>.r<N>.md, imported through the same parser as an upload.
// They belong to the invented club's demo accounts and are marked as demo data.
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { eq } from 'drizzle-orm';
import { parseDesignFile } from '$lib/design-file';
import { db } from '../db';
import { users } from '../db/schema';
import { toSessionUser } from '../accounts/auth';
import { createDesign } from '../designs/designs';
import { getDesignBySlug } from '../designs/lookups';
import { saveDraft, startRevision, submitRevision } from '../designs/revisions';
import { getRevision } from '../designs/lookups';

/** Which demo member authored which demo design (everything else: the first author). */
const DEMO_OWNERS: Record<string, string> = {
	'axial-helix-435': 'jules@lanternhill.example',
	'ground-plane-144': 'jules@lanternhill.example'
};
const DEFAULT_OWNER = 'priya@lanternhill.example';

function demoDesignFiles(dir: string) {
	return readdirSync(dir)
		.map((name) => /^([a-z0-9-]+)\.r(\d+)\.md$/.exec(name))
		.filter((m): m is RegExpExecArray => m !== null)
		.map((m) => ({ file: join(dir, m[0]), slug: m[1], number: Number(m[2]) }))
		.sort((a, b) => a.slug.localeCompare(b.slug) || a.number - b.number);
}

export function seedDesigns(dir: string, log: (line: string) => void = console.log): void {
	for (const entry of demoDesignFiles(dir)) {
		const parsed = parseDesignFile(readFileSync(entry.file, 'utf8'));
		if (!parsed.ok) throw new Error(`${entry.file}: ${parsed.error.message}`);
		const email = DEMO_OWNERS[entry.slug] ?? DEFAULT_OWNER;
		const row = db.select().from(users).where(eq(users.email, email)).get();
		if (!row) throw new Error(`demo owner ${email} is missing; seed the accounts first`);
		const owner = toSessionUser(row);
		const { title, slug, family, polarization, summary, ...content } = parsed.value;
		const design = getDesignBySlug(entry.slug);
		if (entry.number === 1) {
			if (design) continue;
			const created = createDesign(
				owner,
				{ title, slug: slug ?? entry.slug, family, polarization, summary },
				content,
				{ isDemo: true }
			);
			submitRevision(owner, created.revisionId);
		} else {
			if (!design) throw new Error(`${entry.file}: r1 of ${entry.slug} is missing`);
			if (getRevision(design.id, entry.number)) continue;
			const draft = startRevision(owner, design);
			if (draft.number !== entry.number)
				throw new Error(
					`${entry.file}: expected r${entry.number}, the design is at r${draft.number}`
				);
			saveDraft(owner, draft.id, content);
			submitRevision(owner, draft.id);
		}
		log(`demo design ${entry.slug} r${entry.number}`);
	}
}

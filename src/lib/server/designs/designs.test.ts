import { describe, expect, it, beforeAll } from 'vitest';
import { createAccount } from '../accounts/accounts';
import { toSessionUser } from '../accounts/auth';
import { db } from '../db';
import { revisions, users } from '../db/schema';
import { eq } from 'drizzle-orm';
import { createDesign, starterContent } from './designs';
import { contentOf } from './content';
import { defaultRevision, getDesignBySlug } from './lookups';
import { saveDraft, startRevision, submitRevision, withdrawRevision } from './revisions';
import { getRevision } from './lookups';
import { DomainError } from '../http/errors';
import { searchDesigns, ftsQuery } from './search';
import type { SessionUser } from '../accounts/auth';
import type { RevisionContent } from '$lib/schemas/design';

let author: SessionUser;
let other: SessionUser;

async function member(email: string) {
	const a = (await createAccount({
		email,
		displayName: email.split('@')[0],
		password: 'long enough pass'
	}))!;
	db.update(users).set({ emailVerifiedAt: new Date() }).where(eq(users.id, a.id)).run();
	return toSessionUser(db.select().from(users).where(eq(users.id, a.id)).get()!);
}

const meta = (title: string, slug?: string) => ({
	title,
	slug,
	family: 'biquad' as const,
	polarization: 'linear' as const,
	summary: 'A test design.'
});

function content(notes = 'Cut the copper wire and bend it into two squares.'): RevisionContent {
	return {
		...starterContent(2.45e9),
		parameters: [{ key: 'vf', label: 'Velocity factor', value: 0.95 }],
		rows: [
			{
				key: 'side',
				label: 'Element side',
				formula: 'lambda / 4 * vf',
				kind: 'resonant',
				tolerance_mm: 0.2
			},
			{
				key: 'wire_d',
				label: 'Wire diameter',
				formula: '1.6 mm',
				kind: 'material',
				catalogue: 'awg'
			}
		],
		notes
	};
}

function expectDomain(fn: () => unknown, status: number) {
	try {
		fn();
	} catch (e) {
		expect(e).toBeInstanceOf(DomainError);
		expect((e as DomainError).status).toBe(status);
		return;
	}
	throw new Error(`expected a ${status}`);
}

beforeAll(async () => {
	author = await member('author@example.org');
	other = await member('other@example.org');
});

describe('designs and revisions', () => {
	it('creates r1 as a draft that only its author may edit, and refuses a taken slug', () => {
		const { slug, revisionId } = createDesign(author, meta('Biquad for testing'), content());
		expect(slug).toBe('biquad-for-testing');
		const r1 = getRevision(getDesignBySlug(slug)!.id, 1)!;
		expect(r1.state).toBe('draft');
		expectDomain(() => saveDraft(other, revisionId, content('changed by someone else')), 403);
		expectDomain(() => createDesign(author, meta('Another', 'biquad-for-testing'), content()), 409);
		expectDomain(() => createDesign(author, meta('New', 'new'), content()), 409);
	});

	it('freezes content on submit: every write path then answers 409 and nothing changes', () => {
		const { slug, revisionId } = createDesign(
			author,
			meta('Frozen biquad'),
			content('original notes')
		);
		submitRevision(author, revisionId);
		expectDomain(() => saveDraft(author, revisionId, content('tampered notes')), 409);
		expectDomain(() => submitRevision(author, revisionId), 409);
		const stored = db.select().from(revisions).where(eq(revisions.id, revisionId)).get()!;
		expect(stored.notes).toBe('original notes');
		expect(stored.state).toBe('submitted');
		// The submitted revision is what readers see until one is approved.
		expect(defaultRevision(getDesignBySlug(slug)!)?.id).toBe(revisionId);
	});

	it('refuses to submit while a row has an error, but saves the draft', () => {
		const bad = content();
		bad.rows.push({
			key: 'broken',
			label: 'Broken',
			formula: 'lambda / nowhere',
			kind: 'resonant'
		});
		const { revisionId } = createDesign(author, meta('Broken biquad'), bad);
		try {
			submitRevision(author, revisionId);
			throw new Error('submitted');
		} catch (e) {
			expect((e as DomainError).status).toBe(422);
			expect((e as DomainError).message).toContain('broken');
		}
		expect(db.select().from(revisions).where(eq(revisions.id, revisionId)).get()!.state).toBe(
			'draft'
		);
	});

	it('a new revision is a copy of the newest one, numbered on; withdraw only from submitted', () => {
		const { slug, revisionId } = createDesign(
			author,
			meta('Copied biquad'),
			content('notes of r1')
		);
		submitRevision(author, revisionId);
		const design = getDesignBySlug(slug)!;
		expectDomain(() => startRevision(other, design), 403);
		const r2 = startRevision(author, design);
		expect(r2.number).toBe(2);
		expect(r2.state).toBe('draft');
		expect(contentOf(r2).notes).toBe('notes of r1');
		expect(contentOf(r2).change_note).toBe('');
		expect(startRevision(author, design).id).toBe(r2.id);
		expectDomain(() => withdrawRevision(author, r2.id), 409);
		expect(withdrawRevision(author, revisionId).state).toBe('withdrawn');
	});
});

describe('search', () => {
	it('finds published designs by a word in their notes, with a highlighted snippet', () => {
		const { revisionId } = createDesign(
			author,
			meta('Searchable biquad'),
			content('Use a tinplate reflector of 123 mm.')
		);
		expect(searchDesigns({ q: 'tinplate' }).total).toBe(0); // drafts are not indexed
		submitRevision(author, revisionId);
		const found = searchDesigns({ q: 'tinplate' });
		expect(found.items.map((i) => i.slug)).toEqual(['searchable-biquad']);
		expect(found.items[0].snippet?.some((p) => p.hit && p.text.toLowerCase() === 'tinplate')).toBe(
			true
		);
		expect(searchDesigns({ q: 'tinpl' }).total).toBe(1); // prefix
		expect(searchDesigns({ q: 'tinplate', family: 'patch' }).total).toBe(0);
		expect(searchDesigns({ q: 'tinplate', containsHz: 2.45e9 }).total).toBe(1);
		expect(searchDesigns({ q: 'tinplate', containsHz: 5.8e9 }).total).toBe(0);
		expect(searchDesigns({ q: 'tinplate', band: [2.4e9, 2.5e9] }).total).toBe(1);
	});

	it('treats FTS syntax in a query as plain words', () => {
		expect(ftsQuery('a" OR * NEAR(')).toBe('"a"* "OR"* "NEAR"*');
		expect(ftsQuery('  ')).toBeNull();
		expect(() => searchDesigns({ q: '"unbalanced AND (' })).not.toThrow();
		expect(searchDesigns({ q: '***' }).total).toBe(0);
	});
});

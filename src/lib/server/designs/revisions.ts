import { and, desc, eq } from 'drizzle-orm';
import { db } from '../db';
import { designs, revisions, type Design, type Revision } from '../db/schema';
import { revisionContentSchema, type RevisionContent } from '$lib/schemas/design';
import { newId } from '../accounts/accounts';
import { DomainError } from '../http/errors';
import { audit } from '../moderation/audit';
import { contentOf, revisionColumns, validated } from './content';
import { getRevisionById } from './lookups';
import { reindexDesign } from './search';
import { assertCompilable, computeRevision } from './dimensions';
import { notifySubmitted } from '../mail/notify';
import type { SessionUser } from '../accounts/auth';

function assertEditable(user: SessionUser, r: Revision): void {
	if (r.authorId !== user.id) throw new DomainError(403, 'Only the author can edit this draft.');
	if (r.state !== 'draft') {
		throw new DomainError(
			409,
			`r${r.number} is ${r.state}; its content is frozen. Start a new revision to change it.`
		);
	}
}

export function saveDraft(
	user: SessionUser,
	revisionId: string,
	contentIn: RevisionContent
): Revision {
	const content = validated(revisionContentSchema, contentIn);
	assertCompilable(content);
	return db.transaction((tx) => {
		const r = tx.select().from(revisions).where(eq(revisions.id, revisionId)).get();
		if (!r) throw new DomainError(404, 'No such revision.');
		assertEditable(user, r);
		const updated = tx
			.update(revisions)
			// Strictly later than the last save: compiled drafts are cached by this time (dimensions.ts).
			.set({
				...revisionColumns(content),
				updatedAt: new Date(Math.max(Date.now(), r.updatedAt.getTime() + 1))
			})
			// The state in the WHERE makes a concurrent submit win cleanly.
			.where(and(eq(revisions.id, r.id), eq(revisions.state, 'draft')))
			.returning()
			.get();
		if (!updated)
			throw new DomainError(409, 'This revision was submitted meanwhile; its content is frozen.');
		return updated;
	});
}

/** Freezes the draft. Refused while any row has an error at the design frequency. */
export function submitRevision(user: SessionUser, revisionId: string, now = new Date()): Revision {
	const r = getRevisionById(revisionId);
	if (!r) throw new DomainError(404, 'No such revision.');
	assertEditable(user, r);
	const result = computeRevision(r, { frequencyHz: r.designHz });
	const broken = [...result.parameters, ...result.rows].filter((row) => row.error);
	if (broken.length) {
		const first = broken[0];
		throw new DomainError(
			422,
			`Fix ${broken.length === 1 ? 'the error' : `${broken.length} errors`} before submitting: ${first.key}: ${first.error!.message}`,
			first.key
		);
	}
	const submitted = db.transaction((tx) => {
		const row = tx
			.update(revisions)
			.set({ state: 'submitted', submittedAt: now, updatedAt: now })
			.where(and(eq(revisions.id, r.id), eq(revisions.state, 'draft')))
			.returning()
			.get();
		if (!row) throw new DomainError(409, 'This revision is no longer a draft.');
		tx.update(designs).set({ updatedAt: now }).where(eq(designs.id, r.designId)).run();
		audit(
			{
				actorId: user.id,
				action: 'revision.submit',
				targetType: 'revision',
				targetId: r.id,
				details: { number: r.number }
			},
			tx
		);
		notifySubmitted(row, tx);
		return row;
	});
	reindexDesign(r.designId);
	return submitted;
}

export function withdrawRevision(user: SessionUser, revisionId: string): Revision {
	const r = getRevisionById(revisionId);
	if (!r) throw new DomainError(404, 'No such revision.');
	if (r.authorId !== user.id)
		throw new DomainError(403, 'Only the author can withdraw a revision.');
	if (r.state !== 'submitted')
		throw new DomainError(
			409,
			`Only a submitted revision can be withdrawn; r${r.number} is ${r.state}.`
		);
	const row = db.transaction((tx) => {
		const updated = tx
			.update(revisions)
			.set({ state: 'withdrawn', decidedAt: new Date() })
			.where(and(eq(revisions.id, r.id), eq(revisions.state, 'submitted')))
			.returning()
			.get();
		if (!updated) throw new DomainError(409, 'This revision changed meanwhile.');
		audit(
			{
				actorId: user.id,
				action: 'revision.withdraw',
				targetType: 'revision',
				targetId: r.id,
				details: { number: r.number }
			},
			tx
		);
		return updated;
	});
	reindexDesign(r.designId);
	return row;
}

/** Opens the next revision as a copy of the newest one (or returns the open draft). */
export function startRevision(user: SessionUser, design: Design, now = new Date()): Revision {
	if (design.ownerId !== user.id)
		throw new DomainError(403, 'Only the design owner can start a new revision.');
	return db.transaction((tx) => {
		const newest = tx
			.select()
			.from(revisions)
			.where(eq(revisions.designId, design.id))
			.orderBy(desc(revisions.number))
			.get();
		if (!newest) throw new DomainError(404, 'This design has no revisions.');
		if (newest.state === 'draft') return newest;
		const content = { ...contentOf(newest), change_note: '' };
		return tx
			.insert(revisions)
			.values({
				id: newId(),
				designId: design.id,
				number: newest.number + 1,
				authorId: user.id,
				state: 'draft',
				createdAt: now,
				updatedAt: now,
				...revisionColumns(content)
			})
			.returning()
			.get();
	});
}

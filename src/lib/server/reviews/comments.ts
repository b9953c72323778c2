/** Review comments: anchored to a dimension row, a line range of the notes, or general; threaded. */
import { asc, eq } from 'drizzle-orm';
import { db } from '../db';
import { comments, designs, revisions, users, type Revision } from '../db/schema';
import { REVIEW_LIMITS, type CommentAnchor } from '$lib/schemas/review';
import { DomainError } from '../http/errors';
import { audit } from '../moderation/audit';
import { newId } from '../accounts/accounts';
import { contentOf } from '../designs/content';
import { ownerName } from '../accounts/users';
import { renderMarkdown } from '../markdown/markdown';
import { notifyComment } from '../mail/notify';
import { isReviewer } from './reviews';
import type { SessionUser } from '../accounts/auth';

export const MAX_COMMENT_CHARS = REVIEW_LIMITS.commentChars;

export const noteLineCount = (r: Revision) =>
	r.notes === '' ? 0 : r.notes.replace(/\r\n?/g, '\n').split('\n').length;

/** Reviewers and the revision's author take part; a draft is only its author's (and has no review yet). */
function assertMayComment(user: SessionUser, r: Revision): void {
	if (r.state === 'draft') {
		if (r.authorId !== user.id)
			throw new DomainError(403, 'This draft is not yours; you cannot comment on it.');
		throw new DomainError(409, 'Comments open once the draft is submitted.');
	}
	if (r.state === 'withdrawn')
		throw new DomainError(409, `r${r.number} was withdrawn; its review is closed.`);
	if (r.authorId !== user.id && !isReviewer(user)) {
		throw new DomainError(403, 'Only reviewers and the author take part in a review.');
	}
}

function checkBody(body: string): string {
	const text = String(body ?? '').trim();
	if (text === '') throw new DomainError(422, 'Write a comment first.', 'body');
	if (text.length > MAX_COMMENT_CHARS) {
		throw new DomainError(
			422,
			`The comment is ${text.length.toLocaleString('en')} characters; the limit is ${MAX_COMMENT_CHARS.toLocaleString('en')}. Split it or shorten it.`,
			'body'
		);
	}
	return text;
}

/** Anchor columns for a new thread, checked against the revision's rows and notes. */
function anchorColumns(r: Revision, anchor: CommentAnchor) {
	if (anchor.kind === 'row') {
		const keys = contentOf(r).rows.map((row) => row.key);
		if (!keys.includes(anchor.rowKey)) {
			throw new DomainError(
				422,
				`r${r.number} has no dimension row with the key "${anchor.rowKey.slice(0, 40)}".`,
				'row_key'
			);
		}
		return {
			anchorKind: 'row' as const,
			anchorRowKey: anchor.rowKey,
			anchorLineStart: null,
			anchorLineEnd: null
		};
	}
	if (anchor.kind === 'lines') {
		const lines = noteLineCount(r);
		const { start, end } = anchor;
		if (!Number.isInteger(start) || !Number.isInteger(end)) {
			throw new DomainError(
				422,
				'Lines must be whole numbers (first and last line of the range).',
				'line_start'
			);
		}
		if (start < 1 || end < start || end > lines) {
			throw new DomainError(
				422,
				lines === 0
					? `r${r.number} has no notes to comment on.`
					: `Lines ${start}–${end} are not a range within the notes (lines 1–${lines}).`,
				'line_start'
			);
		}
		return {
			anchorKind: 'lines' as const,
			anchorRowKey: null,
			anchorLineStart: start,
			anchorLineEnd: end
		};
	}
	return {
		anchorKind: 'general' as const,
		anchorRowKey: null,
		anchorLineStart: null,
		anchorLineEnd: null
	};
}

export interface NewComment {
	body: string;
	anchor?: CommentAnchor;
	/** Reply to this comment's thread; the reply takes the thread's anchor. */
	parentId?: string;
}

export function addComment(
	user: SessionUser,
	revisionId: string,
	input: NewComment,
	options: { now?: Date; notify?: boolean } = {}
) {
	const body = checkBody(input.body);
	const now = options.now ?? new Date();
	return db.transaction((tx) => {
		const r = tx.select().from(revisions).where(eq(revisions.id, revisionId)).get();
		if (!r) throw new DomainError(404, 'No such revision.');
		assertMayComment(user, r);
		let parent: typeof comments.$inferSelect | undefined;
		if (input.parentId) {
			parent = tx.select().from(comments).where(eq(comments.id, input.parentId)).get();
			if (!parent || parent.revisionId !== r.id)
				throw new DomainError(404, 'The comment you answer does not exist.', 'parent_id');
			// Threads are one level deep: a reply to a reply joins the same thread.
			if (parent.parentId)
				parent = tx.select().from(comments).where(eq(comments.id, parent.parentId)).get();
		}
		const anchor = parent
			? {
					anchorKind: parent!.anchorKind,
					anchorRowKey: parent!.anchorRowKey,
					anchorLineStart: parent!.anchorLineStart,
					anchorLineEnd: parent!.anchorLineEnd
				}
			: anchorColumns(r, input.anchor ?? { kind: 'general' });
		const id = newId();
		tx.insert(comments)
			.values({
				id,
				revisionId: r.id,
				authorId: user.id,
				parentId: parent?.id ?? null,
				...anchor,
				body,
				createdAt: now
			})
			.run();
		audit(
			{
				actorId: user.id,
				action: parent ? 'comment.reply' : 'comment.add',
				targetType: 'revision',
				targetId: r.id,
				details: { comment: id, anchor: anchor.anchorKind }
			},
			tx
		);
		if (options.notify !== false) {
			const design = tx.select().from(designs).where(eq(designs.id, r.designId)).get()!;
			notifyComment(
				{
					design,
					revision: r,
					commentId: id,
					writerId: user.id,
					writerName: user.displayName,
					body,
					threadStarterId: parent?.authorId ?? null
				},
				tx
			);
		}
		return { id, threadId: parent?.id ?? id };
	});
}

/** Marks a thread resolved (or open again): its starter or the revision's author may. */
export function setResolved(
	user: SessionUser,
	commentId: string,
	resolved: boolean,
	now = new Date()
) {
	return db.transaction((tx) => {
		const c = tx.select().from(comments).where(eq(comments.id, commentId)).get();
		if (!c) throw new DomainError(404, 'No such comment.');
		const r = tx.select().from(revisions).where(eq(revisions.id, c.revisionId)).get()!;
		if (c.parentId) throw new DomainError(409, 'Resolve the thread, not a reply.');
		if (user.id !== c.authorId && user.id !== r.authorId) {
			throw new DomainError(
				403,
				"Only the thread's starter or the revision's author can resolve it."
			);
		}
		tx.update(comments)
			.set(
				resolved
					? { resolvedAt: now, resolvedById: user.id }
					: { resolvedAt: null, resolvedById: null }
			)
			.where(eq(comments.id, c.id))
			.run();
		audit(
			{
				actorId: user.id,
				action: resolved ? 'comment.resolve' : 'comment.reopen',
				targetType: 'comment',
				targetId: c.id
			},
			tx
		);
	});
}

interface CommentView {
	id: string;
	authorName: string;
	isAuthorOfRevision: boolean;
	html: string;
	createdAt: string;
}

export interface ThreadView extends CommentView {
	anchor: CommentAnchor;
	resolved: boolean;
	resolvedBy: string | null;
	canResolve: boolean;
	replies: CommentView[];
}

/** Every thread of a revision with sanitized HTML bodies, oldest first. */
export function listThreads(r: Revision, user: SessionUser | null): ThreadView[] {
	const rows = db
		.select({ c: comments, name: users.displayName })
		.from(comments)
		.innerJoin(users, eq(users.id, comments.authorId))
		.where(eq(comments.revisionId, r.id))
		.orderBy(asc(comments.createdAt), asc(comments.id))
		.all();
	const view = (x: (typeof rows)[number]): CommentView => ({
		id: x.c.id,
		authorName: x.name,
		isAuthorOfRevision: x.c.authorId === r.authorId,
		html: renderMarkdown(x.c.body),
		createdAt: x.c.createdAt.toISOString()
	});
	return rows
		.filter((x) => x.c.parentId === null)
		.map((x) => {
			const c = x.c;
			const anchor: CommentAnchor =
				c.anchorKind === 'row'
					? { kind: 'row', rowKey: c.anchorRowKey ?? '' }
					: c.anchorKind === 'lines'
						? {
								kind: 'lines',
								start: c.anchorLineStart ?? 1,
								end: c.anchorLineEnd ?? c.anchorLineStart ?? 1
							}
						: { kind: 'general' };
			return {
				...view(x),
				anchor,
				resolved: c.resolvedAt !== null,
				resolvedBy: c.resolvedById ? ownerName(c.resolvedById) : null,
				canResolve: !!user && (user.id === c.authorId || user.id === r.authorId),
				replies: rows.filter((y) => y.c.parentId === c.id).map(view)
			};
		});
}

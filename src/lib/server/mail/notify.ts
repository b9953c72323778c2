/** Notification mails (queued in the caller's transaction) and the settings that decide who gets them. */
import { and, eq, inArray, isNotNull, isNull } from 'drizzle-orm';
import { db } from '../db';
import { designs, users, type Design, type Revision } from '../db/schema';
import { FAMILY_VALUES, type Family } from '$lib/schemas/design';
import { familyLabel } from '$lib/format';
import { queueMail } from './send';
import { publicOrigin } from '../http/config';

export type Tx = Parameters<Parameters<typeof db.transaction>[0]>[0];
type Reader = Pick<typeof db, 'select'>;

/** Header text from user input: no CR/LF (header injection), and a sane length. */
export const headerSafe = (s: string) => s.replace(/[\r\n\u2028\u2029]+/g, ' ').slice(0, 150);

const VERDICT_WORDS = {
	approve: 'approved',
	revise: 'returned for revision',
	reject: 'proposed to reject'
};

const reviewLink = (slug: string, n: number, hash = '') =>
	`${publicOrigin()}/review/${slug}/${n}${hash}`;

export interface NotificationSettings {
	notifyOnSubmit: boolean;
	notifyOnFeedback: boolean;
	followedFamilies: Family[];
}

export function notificationSettings(userId: string): NotificationSettings {
	const row = db.select().from(users).where(eq(users.id, userId)).get();
	const followed = Array.isArray(row?.followedFamilies) ? row.followedFamilies : [];
	return {
		notifyOnSubmit: row?.notifyOnSubmit ?? false,
		notifyOnFeedback: row?.notifyOnFeedback ?? true,
		followedFamilies: followed.filter((f): f is Family =>
			(FAMILY_VALUES as readonly string[]).includes(f)
		)
	};
}

export function setNotificationSettings(userId: string, settings: NotificationSettings): void {
	const families = [...new Set(settings.followedFamilies)].filter((f) =>
		(FAMILY_VALUES as readonly string[]).includes(f)
	);
	db.update(users)
		.set({
			notifyOnSubmit: settings.notifyOnSubmit,
			notifyOnFeedback: settings.notifyOnFeedback,
			followedFamilies: families
		})
		.where(eq(users.id, userId))
		.run();
}

/** Reviewers who opted in and follow the family (following none means every family). */
function submitRecipients(family: string, authorId: string, tx: Reader = db) {
	return tx
		.select({ id: users.id, email: users.email, followed: users.followedFamilies })
		.from(users)
		.where(
			and(
				eq(users.notifyOnSubmit, true),
				inArray(users.role, ['reviewer', 'moderator']),
				isNotNull(users.emailVerifiedAt),
				isNull(users.disabledAt)
			)
		)
		.all()
		.filter((u) => u.id !== authorId)
		.filter(
			(u) => !Array.isArray(u.followed) || u.followed.length === 0 || u.followed.includes(family)
		);
}

/** Called inside submitRevision's transaction. */
export function notifySubmitted(r: Revision, tx: Tx): number {
	const design = tx.select().from(designs).where(eq(designs.id, r.designId)).get();
	if (!design) return 0;
	const recipients = submitRecipients(design.family, r.authorId, tx);
	for (const u of recipients) {
		queueMail(
			{
				to: u.email,
				subject: headerSafe(`Review wanted: ${design.title} r${r.number}`),
				text: [
					`${design.title} r${r.number} (${familyLabel(design.family)}) was submitted for review.`,
					...(r.changeNote ? [`Change note: ${r.changeNote}`] : []),
					'',
					`Review it: ${reviewLink(design.slug, r.number)}`,
					'',
					'You get this mail because you follow this family. Change it on your account page:',
					`${publicOrigin()}/account`
				].join('\n')
			},
			tx
		);
	}
	return recipients.length;
}

function feedbackAddress(userId: string, tx: Reader): string | null {
	const u = tx.select().from(users).where(eq(users.id, userId)).get();
	if (!u || !u.notifyOnFeedback || u.disabledAt || !u.emailVerifiedAt) return null;
	return u.email;
}

export function notifyReview(
	args: {
		design: Design;
		revision: Revision;
		reviewerName: string;
		verdict: keyof typeof VERDICT_WORDS;
		summary: string;
		reviewId: string;
	},
	tx: Tx
): boolean {
	const { design, revision: r } = args;
	const to = feedbackAddress(r.authorId, tx);
	if (!to) return false;
	queueMail(
		{
			to,
			subject: headerSafe(`Review of ${design.title} r${r.number}: ${VERDICT_WORDS[args.verdict]}`),
			text: [
				`${args.reviewerName} reviewed ${design.title} r${r.number}: ${VERDICT_WORDS[args.verdict]}.`,
				'',
				args.summary,
				'',
				`Read it: ${reviewLink(design.slug, r.number, `#review-${args.reviewId}`)}`
			].join('\n')
		},
		tx
	);
	return true;
}

/** A comment mails the revision's author, and the thread's starter on a reply (never the writer). */
export function notifyComment(
	args: {
		design: Design;
		revision: Revision;
		commentId: string;
		writerId: string;
		writerName: string;
		body: string;
		threadStarterId: string | null;
	},
	tx: Tx
): number {
	const { design, revision: r } = args;
	const ids = [
		...new Set([r.authorId, args.threadStarterId].filter((x): x is string => !!x))
	].filter((id) => id !== args.writerId);
	let sent = 0;
	for (const id of ids) {
		const to = feedbackAddress(id, tx);
		if (!to) continue;
		const excerpt = args.body.length > 600 ? `${args.body.slice(0, 600)}…` : args.body;
		queueMail(
			{
				to,
				subject: headerSafe(
					`${args.threadStarterId ? 'Reply' : 'Comment'} on ${design.title} r${r.number}`
				),
				text: [
					`${args.writerName} wrote on ${design.title} r${r.number}:`,
					'',
					excerpt,
					'',
					`Answer it: ${reviewLink(design.slug, r.number, `#comment-${args.commentId}`)}`
				].join('\n')
			},
			tx
		);
		sent++;
	}
	return sent;
}

export function notifyRejectConfirmed(
	args: { design: Design; revision: Revision; moderatorName: string },
	tx: Tx
): boolean {
	const { design, revision: r } = args;
	const to = feedbackAddress(r.authorId, tx);
	if (!to) return false;
	queueMail(
		{
			to,
			subject: headerSafe(`${design.title} r${r.number} was rejected`),
			text: [
				`${args.moderatorName} confirmed a reviewer's rejection of ${design.title} r${r.number}.`,
				'The revision is returned; you can start a new revision from it.',
				'',
				`Read the reviews: ${reviewLink(design.slug, r.number, '#reviews')}`
			].join('\n')
		},
		tx
	);
	return true;
}

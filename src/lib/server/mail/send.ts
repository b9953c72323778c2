import { env } from '$env/dynamic/private';
import { and, asc, eq, isNull, lte } from 'drizzle-orm';
import { join } from 'node:path';
import { building } from '$app/environment';
import { db } from '../db';
import { mailQueue } from '../db/schema';
import { createMailer } from './index';
import { dataDir, isProduction } from '../http/config';

export const outboxDir = () => join(dataDir(), 'outbox');
export const usesOutbox = () => !env.SMTP_URL;

/** What an operator must know about mail: a production server without SMTP sends none. */
export function mailWarnings(): string[] {
	if (!usesOutbox() || !isProduction()) return [];
	return [
		'SMTP_URL is not set: no mail is delivered (sign-up confirmations, password resets); it is only written to the outbox folder.'
	];
}

/** Says so loudly at start: nobody reads the outbox of a production server by accident. */
export function warnAboutMail(log: (line: string) => void = console.warn): void {
	const warnings = mailWarnings();
	if (warnings.length === 0) return;
	const rule = '!'.repeat(78);
	log(
		[
			rule,
			...warnings.map((w) => `!! ${w}`),
			`!! Outbox: ${outboxDir()}`,
			'!! Set SMTP_URL (see README, Configuration) to send mail.',
			rule
		].join('\n')
	);
}

let mailer: ReturnType<typeof createMailer> | null = null;
function getMailer() {
	mailer ??= createMailer({
		smtpUrl: env.SMTP_URL || undefined,
		from: env.MAIL_FROM || 'no-reply@bandwright.invalid',
		outboxDir: outboxDir()
	});
	return mailer;
}

const MAX_ATTEMPTS = 5;

/** All mail goes through the queue table, written in the caller's transaction, sent right after commit. */
export function queueMail(
	msg: { to: string; subject: string; text: string },
	tx: Pick<typeof db, 'insert'> = db
): void {
	tx.insert(mailQueue)
		.values({ toAddress: msg.to, subject: msg.subject, body: msg.text, nextAttemptAt: new Date() })
		.run();
	setTimeout(() => void deliverQueued(), 0);
}

let delivering: Promise<number> | null = null;
let requested = false;

/** Sends what is due. A call during a run makes that run look again when it ends, so no mail waits for the worker. */
function deliverQueued(): Promise<number> {
	requested = true;
	delivering ??= (async () => {
		let sent = 0;
		while (requested) {
			requested = false;
			sent += await deliverDue(Date.now());
		}
		return sent;
	})().finally(() => (delivering = null));
	return delivering;
}

/** Resolves once the deliveries queued so far have run (a test waits for it before its database goes). */
export async function mailSettled(): Promise<void> {
	await new Promise((resolve) => setTimeout(resolve, 0));
	while (delivering) await delivering;
}

async function deliverDue(now: number): Promise<number> {
	let sent = 0;
	try {
		const due = db
			.select()
			.from(mailQueue)
			.where(and(isNull(mailQueue.sentAt), lte(mailQueue.nextAttemptAt, new Date(now))))
			.orderBy(asc(mailQueue.id))
			.limit(50)
			.all()
			.filter((m) => m.attempts < MAX_ATTEMPTS);
		for (const m of due) {
			try {
				await getMailer().send({ to: m.toAddress, subject: m.subject, text: m.body });
				db.update(mailQueue)
					.set({ sentAt: new Date(), attempts: m.attempts + 1 })
					.where(eq(mailQueue.id, m.id))
					.run();
				sent++;
			} catch (e) {
				const attempts = m.attempts + 1;
				console.error(`mail ${m.id} to ${m.toAddress} failed (attempt ${attempts})`, e);
				db.update(mailQueue)
					.set({
						attempts,
						lastError: String(e).slice(0, 500),
						nextAttemptAt: new Date(Date.now() + 30_000 * 2 ** attempts)
					})
					.where(eq(mailQueue.id, m.id))
					.run();
			}
		}
	} catch (e) {
		// The queue itself could not be read or updated (the database is busy): the worker comes back.
		console.error('mail queue: delivery stopped; the worker tries again shortly', e);
	}
	return sent;
}

let worker: ReturnType<typeof setInterval> | null = null;
export function startMailWorker() {
	if (worker || building) return;
	worker = setInterval(() => void deliverQueued(), 15_000);
	worker.unref();
}

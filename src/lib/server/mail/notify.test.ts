import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mailSettled } from './send';
import { eq } from 'drizzle-orm';
import { createAccount } from '../accounts/accounts';
import { toSessionUser, type SessionUser } from '../accounts/auth';
import { db } from '../db';
import { mailQueue, users, type Role } from '../db/schema';
import { createDesign, starterContent } from '../designs/designs';
import { submitRevision } from '../designs/revisions';
import { headerSafe, notificationSettings, setNotificationSettings } from './notify';

let author: SessionUser;
const people: Record<string, SessionUser> = {};

async function person(email: string, role: Role) {
	const a = (await createAccount({
		email,
		displayName: email.split('@')[0],
		password: 'long enough pass'
	}))!;
	db.update(users).set({ emailVerifiedAt: new Date(), role }).where(eq(users.id, a.id)).run();
	return toSessionUser(db.select().from(users).where(eq(users.id, a.id)).get()!);
}

const mails = (to: string) => db.select().from(mailQueue).where(eq(mailQueue.toAddress, to)).all();

// Notices are sent in the background: let them finish before this file's database goes.
afterAll(mailSettled);

beforeAll(async () => {
	author = await person('n-author@example.org', 'member');
	for (const [name, role] of [
		['patchfan', 'reviewer'],
		['everything', 'reviewer'],
		['quiet', 'reviewer'],
		['member', 'member']
	] as const) {
		people[name] = await person(`n-${name}@example.org`, role);
	}
	setNotificationSettings(people.patchfan.id, {
		notifyOnSubmit: true,
		notifyOnFeedback: true,
		followedFamilies: ['patch']
	});
	setNotificationSettings(people.everything.id, {
		notifyOnSubmit: true,
		notifyOnFeedback: true,
		followedFamilies: []
	});
	setNotificationSettings(people.member.id, {
		notifyOnSubmit: true,
		notifyOnFeedback: true,
		followedFamilies: []
	});
});

describe('submission notices', () => {
	it('mail opted-in reviewers who follow the family (or every family), in the submit transaction', () => {
		const make = (family: 'patch' | 'dipole', title: string) => {
			const { revisionId } = createDesign(
				author,
				{ title, family, polarization: 'linear', summary: '' },
				starterContent(5.8e9)
			);
			submitRevision(author, revisionId);
		};
		make('patch', 'Patch for the notices');
		make('dipole', 'Dipole for the notices');
		expect(mails('n-patchfan@example.org').map((m) => m.subject)).toEqual([
			'Review wanted: Patch for the notices r1'
		]);
		expect(mails('n-everything@example.org')).toHaveLength(2);
		expect(mails('n-quiet@example.org')).toHaveLength(0);
		// Members are not reviewers, whatever their settings say.
		expect(mails('n-member@example.org')).toHaveLength(0);
		expect(mails('n-patchfan@example.org')[0].body).toMatch(/\/review\/patch-for-the-notices\/1\b/);
	});

	it('keeps only known families and strips CR/LF from header text', () => {
		setNotificationSettings(people.quiet.id, {
			notifyOnSubmit: false,
			notifyOnFeedback: false,
			followedFamilies: ['patch', 'patch', 'bogus' as 'patch']
		});
		expect(notificationSettings(people.quiet.id)).toEqual({
			notifyOnSubmit: false,
			notifyOnFeedback: false,
			followedFamilies: ['patch']
		});
		expect(headerSafe('Title\r\nBcc: victim@example.org')).toBe('Title Bcc: victim@example.org');
	});
});

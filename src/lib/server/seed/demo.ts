// Demo data: an invented makers' radio club. Every name, address and password here is demo data.
import { count, eq } from 'drizzle-orm';
import { db } from '../db';
import { users, type Role } from '../db/schema';
import { createAccount } from '../accounts/accounts';
import { setRole } from '../accounts/users';
import { seedDesigns } from './designs';
import { seedReviews } from './reviews';
import { resolve } from 'node:path';

const DEMO_ACCOUNTS: {
	email: string;
	displayName: string;
	password: string;
	role: Role;
	verified: boolean;
}[] = [
	{
		email: 'wren@lanternhill.example',
		displayName: 'Wren Okafor (demo)',
		password: 'demo-moderator-2026',
		role: 'moderator',
		verified: true
	},
	{
		email: 'tomas@lanternhill.example',
		displayName: 'Tomas Varga (demo)',
		password: 'demo-reviewer-2026',
		role: 'reviewer',
		verified: true
	},
	{
		email: 'ines@lanternhill.example',
		displayName: 'Ines Halvorsen (demo)',
		password: 'demo-reviewer-2026',
		role: 'reviewer',
		verified: true
	},
	{
		email: 'priya@lanternhill.example',
		displayName: 'Priya Nandakumar (demo)',
		password: 'demo-member-2026',
		role: 'member',
		verified: true
	},
	{
		email: 'jules@lanternhill.example',
		displayName: 'Jules Mbeki (demo)',
		password: 'demo-member-2026',
		role: 'member',
		verified: true
	},
	{
		email: 'newcomer@lanternhill.example',
		displayName: 'Sam Newcomer (demo)',
		password: 'demo-member-2026',
		role: 'member',
		verified: false
	}
];

export function isEmpty(): boolean {
	return (db.select({ n: count() }).from(users).get()?.n ?? 0) === 0;
}

export async function seedDemo(log: (line: string) => void = console.log): Promise<void> {
	for (const a of DEMO_ACCOUNTS) {
		const created = await createAccount(a);
		if (!created) continue;
		db.update(users)
			.set({ isDemo: true, emailVerifiedAt: a.verified ? new Date() : null })
			.where(eq(users.id, created.id))
			.run();
		if (a.role !== 'member') setRole(null, created.id, a.role);
		log(`demo account ${a.email} (${a.role})`);
	}
	seedDesigns(resolve('content/designs'), log);
	seedReviews(log);
	await (await import('./measurements')).seedMeasurements(log);
}

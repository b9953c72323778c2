import { asc, eq, like, or, sql } from 'drizzle-orm';
import { db } from '../db';
import { users, type Role } from '../db/schema';
import { audit } from '../moderation/audit';

export function listUsers(query = '', limit = 200) {
	const q = query.trim().slice(0, 100);
	const base = db
		.select({
			id: users.id,
			email: users.email,
			displayName: users.displayName,
			role: users.role,
			emailVerifiedAt: users.emailVerifiedAt,
			createdAt: users.createdAt
		})
		.from(users);
	const filtered = q
		? base.where(or(like(users.email, `%${q}%`), like(users.displayName, `%${q}%`)))
		: base;
	return filtered.orderBy(asc(users.email)).limit(limit).all();
}

export type RoleChange = { ok: true; from: Role; to: Role } | { ok: false; message: string };

/** Grants or revokes a role; the change and its audit row commit together. */
export function setRole(actorId: string | null, userId: string, role: Role): RoleChange {
	return db.transaction((tx) => {
		const target = tx.select().from(users).where(eq(users.id, userId)).get();
		if (!target) return { ok: false as const, message: 'No such user.' };
		if (actorId === userId && role !== 'moderator') {
			return { ok: false as const, message: 'You cannot remove your own moderator role.' };
		}
		if (target.role === role) return { ok: true as const, from: role, to: role };
		tx.update(users).set({ role }).where(eq(users.id, userId)).run();
		audit(
			{
				actorId,
				action: 'role.set',
				targetType: 'user',
				targetId: userId,
				details: { email: target.email, from: target.role, to: role }
			},
			tx
		);
		return { ok: true as const, from: target.role, to: role };
	});
}

const displayNameById = db
	.select({ n: users.displayName })
	.from(users)
	.where(eq(users.id, sql.placeholder('id')))
	.prepare();

/** The display name pages show for an account ("unknown" when there is none). */
export function ownerName(userId: string): string {
	return displayNameById.get({ id: userId })?.n ?? 'unknown';
}

/** What the account page shows of its owner. */
export function accountOf(userId: string) {
	const row = db.select().from(users).where(eq(users.id, userId)).get()!;
	return {
		email: row.email,
		displayName: row.displayName,
		role: row.role,
		emailVerified: row.emailVerifiedAt !== null,
		createdAt: row.createdAt.toISOString()
	};
}

import { desc, eq } from 'drizzle-orm';
import { db } from '../db';
import { auditLog, users } from '../db/schema';

export interface AuditEntry {
	actorId: string | null;
	action: string;
	targetType: string;
	targetId: string;
	details?: Record<string, unknown>;
}

/** Pass the transaction when the audited change is part of one, so both commit together. */
export function audit(entry: AuditEntry, tx: Pick<typeof db, 'insert'> = db): void {
	tx.insert(auditLog)
		.values({ ...entry, details: entry.details ?? {} })
		.run();
}

export function listAudit(limit = 100, offset = 0) {
	return db
		.select({
			id: auditLog.id,
			action: auditLog.action,
			targetType: auditLog.targetType,
			targetId: auditLog.targetId,
			details: auditLog.details,
			createdAt: auditLog.createdAt,
			actorName: users.displayName,
			actorEmail: users.email
		})
		.from(auditLog)
		.leftJoin(users, eq(users.id, auditLog.actorId))
		.orderBy(desc(auditLog.id))
		.limit(limit)
		.offset(offset)
		.all();
}

import { describe, expect, it } from 'vitest';
import { createAccount } from './accounts';
import { listAudit } from '../moderation/audit';
import { setRole } from './users';
import { sqlite } from '../db';

describe('roles', () => {
	it('writes each change and its audit row together', async () => {
		const mod = (await createAccount({
			email: 'm@example.org',
			displayName: 'Mod',
			password: 'long enough pass'
		}))!;
		const u = (await createAccount({
			email: 'u@example.org',
			displayName: 'User',
			password: 'long enough pass'
		}))!;
		expect(setRole(null, mod.id, 'moderator')).toEqual({
			ok: true,
			from: 'member',
			to: 'moderator'
		});
		expect(setRole(mod.id, u.id, 'reviewer')).toEqual({ ok: true, from: 'member', to: 'reviewer' });
		const [latest] = listAudit(1);
		expect(latest.action).toBe('role.set');
		expect(latest.actorEmail).toBe('m@example.org');
		expect(latest.details).toEqual({ email: 'u@example.org', from: 'member', to: 'reviewer' });
		expect(setRole(mod.id, mod.id, 'member')).toEqual({
			ok: false,
			message: 'You cannot remove your own moderator role.'
		});
		expect(setRole(mod.id, 'nobody', 'member')).toEqual({ ok: false, message: 'No such user.' });
		expect(listAudit(10)).toHaveLength(2);
	});

	it('runs with the pragmas we promise', () => {
		expect(sqlite.pragma('foreign_keys', { simple: true })).toBe(1);
		expect(sqlite.pragma('busy_timeout', { simple: true })).toBe(5000);
		expect(sqlite.pragma('integrity_check', { simple: true })).toBe('ok');
	});
});

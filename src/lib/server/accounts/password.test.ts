import { describe, expect, it } from 'vitest';
import { hashPassword, passwordProblem, verifyPassword } from './password';

describe('passwords', () => {
	it('hashes with argon2id at the ASVS minimum cost or above', async () => {
		const h = await hashPassword('correct horse battery staple');
		// PHC string: $argon2id$v=19$m=19456,t=2,p=1$… (ASVS 5.0 appendix C: t=2 needs m ≥ 19456 KiB, p=1)
		expect(h).toMatch(/^\$argon2id\$v=19\$m=19456,t=2,p=1\$/);
		expect(await verifyPassword(h, 'correct horse battery staple')).toBe(true);
		expect(await verifyPassword(h, 'correct horse battery stapl')).toBe(false);
		expect(await verifyPassword('not a hash', 'x')).toBe(false);
	});

	it('accepts long Unicode passphrases and rejects short, common and own-address ones', () => {
		expect(passwordProblem('ünïcødé påsswörd ✓ 天线')).toBeNull();
		expect(passwordProblem('x'.repeat(128))).toBeNull();
		expect(passwordProblem('x'.repeat(129))).toMatch(/at most 128/);
		expect(passwordProblem('1234567')).toMatch(/at least 8/);
		expect(passwordProblem('Password123')).toMatch(/most common/);
		expect(passwordProblem('me@example.org', 'ME@example.org')).toMatch(/e-mail/);
	});

	it('normalizes Unicode so the same passphrase typed two ways verifies', async () => {
		const h = await hashPassword('caf\u00e9 au lait, please');
		expect(await verifyPassword(h, 'cafe\u0301 au lait, please')).toBe(true);
	});
});

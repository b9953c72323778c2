import { hash, verify } from '@node-rs/argon2';
import { COMMON_PASSWORDS } from './common-passwords';

// argon2id (algorithm 2) with explicit cost: ASVS 5.0 appendix C minimum for t=2 is m=19456 KiB, p=1.
const ARGON2_OPTIONS = { algorithm: 2, memoryCost: 19456, timeCost: 2, parallelism: 1 } as const;

const PASSWORD_MIN = 8;
const PASSWORD_MAX = 128;

export function hashPassword(password: string): Promise<string> {
	return hash(password.normalize('NFC'), ARGON2_OPTIONS);
}

export async function verifyPassword(hashed: string, password: string): Promise<boolean> {
	try {
		return await verify(hashed, password.normalize('NFC'));
	} catch {
		return false;
	}
}

let dummyHash: Promise<string> | null = null;
/** Verify against a throw-away hash so a missing account costs the same time as a wrong password. */
export async function burnPasswordCheck(password: string): Promise<void> {
	dummyHash ??= hashPassword('bandwright-dummy-password-for-timing');
	await verifyPassword(await dummyHash, password);
}

export function passwordProblem(password: string, email?: string): string | null {
	const chars = [...password].length;
	if (chars < PASSWORD_MIN)
		return `Use at least ${PASSWORD_MIN} characters (15 or more is better).`;
	if (chars > PASSWORD_MAX) return `Use at most ${PASSWORD_MAX} characters.`;
	const lower = password.toLowerCase();
	if (COMMON_PASSWORDS.has(lower)) return 'This password is on the list of most common passwords.';
	if (email && lower === email.toLowerCase())
		return 'The password must not be your e-mail address.';
	return null;
}

import { z } from '../zod';

const EMAIL_MAX = 254;
const NAME_MAX = 60;

const email = z
	.string()
	.trim()
	.min(1, 'Enter your e-mail address.')
	.max(EMAIL_MAX, `At most ${EMAIL_MAX} characters.`)
	.pipe(z.email('Enter a valid e-mail address, like name@example.org.'));

// Length and common-password checks happen on the server (password.ts) so the message is one place.
const password = z.string().min(1, 'Enter a password.').max(1024, 'At most 128 characters.');

export const signUpSchema = z.object({
	email,
	displayName: z
		.string()
		.trim()
		.min(2, 'Use at least 2 characters.')
		.max(NAME_MAX, `At most ${NAME_MAX} characters.`)
		.regex(/^[^<>\u0000-\u001f]+$/, 'Names cannot contain < > or control characters.'),
	password
});

export const signInSchema = z.object({ email, password, next: z.string().max(500).default('') });

export const resetRequestSchema = z.object({ email });

export const resetConfirmSchema = z.object({
	token: z.string().min(1).max(100),
	password
});

/** The confirm button of an e-mail link carries its token. */
export const verifySchema = z.object({ token: z.string().max(100).default('') });

export const roleChangeSchema = z.object({
	userId: z.string().min(1).max(40),
	role: z.enum(['member', 'reviewer', 'moderator'])
});

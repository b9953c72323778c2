/**
 * Account mail (confirmation, reset, "you already have an account"). Queued (mail/send.ts), never
 * awaited: the queue sends it right after, with retries, and an answer never waits for the mail
 * server, so its time cannot tell whether an address has an account.
 */
import { publicOrigin } from '../http/config';
import { findUserByEmail, issueEmailToken } from './accounts';
import { retryBusy } from '../db/busy';
import { queueMail } from '../mail/send';

export function sendVerificationMail(to: string, name: string, token: string): void {
	const link = `${publicOrigin()}/verify?token=${encodeURIComponent(token)}`;
	queueMail({
		to,
		subject: 'Confirm your e-mail address for Bandwright',
		text:
			`Hello ${name},\n\nConfirm your address to start publishing designs and sweeps:\n\n${link}\n\n` +
			`The link works once and expires in 48 hours. If you did not sign up, ignore this mail.\n`
	});
}

export function sendAlreadyRegisteredMail(to: string): void {
	queueMail({
		to,
		subject: 'Someone tried to sign up to Bandwright with your address',
		text:
			`Your address already has a Bandwright account, so no new account was made.\n\n` +
			`Sign in: ${publicOrigin()}/signin\nForgot the password? ${publicOrigin()}/reset\n\n` +
			`If this was not you, you can ignore this mail.\n`
	});
}

function sendResetMail(to: string, token: string): void {
	const link = `${publicOrigin()}/reset/confirm?token=${encodeURIComponent(token)}`;
	queueMail({
		to,
		subject: 'Reset your Bandwright password',
		text:
			`Choose a new password here:\n\n${link}\n\nThe link works once and expires in 1 hour. ` +
			`Setting a new password signs you out everywhere. If you did not ask for this, ignore this mail.\n`
	});
}

/**
 * A reset link for the address's account, if it has one that is not disabled. Returns at once having
 * done nothing yet: the lookup, the token and the queued mail happen once the answer has gone, so the
 * answer takes the same time for every address.
 */
export function requestPasswordReset(email: string): void {
	setTimeout(() => {
		retryBusy(() => {
			const user = findUserByEmail(email);
			if (user && !user.disabledAt)
				sendResetMail(user.email, issueEmailToken(user.id, 'reset_password'));
		}).catch((e) => console.error('password reset: no link was queued', e));
	}, 0);
}

import { publicOrigin } from '../http/config';
import { sendNow } from '../mail/send';

export async function sendVerificationMail(to: string, name: string, token: string) {
	const link = `${publicOrigin()}/verify?token=${encodeURIComponent(token)}`;
	await sendNow(
		to,
		'Confirm your e-mail address for Bandwright',
		`Hello ${name},\n\nConfirm your address to start publishing designs and sweeps:\n\n${link}\n\n` +
			`The link works once and expires in 48 hours. If you did not sign up, ignore this mail.\n`
	);
}

export async function sendAlreadyRegisteredMail(to: string) {
	await sendNow(
		to,
		'Someone tried to sign up to Bandwright with your address',
		`Your address already has a Bandwright account, so no new account was made.\n\n` +
			`Sign in: ${publicOrigin()}/signin\nForgot the password? ${publicOrigin()}/reset\n\n` +
			`If this was not you, you can ignore this mail.\n`
	);
}

export async function sendResetMail(to: string, token: string) {
	const link = `${publicOrigin()}/reset/confirm?token=${encodeURIComponent(token)}`;
	await sendNow(
		to,
		'Reset your Bandwright password',
		`Choose a new password here:\n\n${link}\n\nThe link works once and expires in 1 hour. ` +
			`Setting a new password signs you out everywhere. If you did not ask for this, ignore this mail.\n`
	);
}

import { expect, type Page } from '@playwright/test';
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';

export const DEMO = {
	moderator: { email: 'wren@lanternhill.example', password: 'demo-moderator-2026' },
	reviewer: { email: 'tomas@lanternhill.example', password: 'demo-reviewer-2026' },
	reviewer2: { email: 'ines@lanternhill.example', password: 'demo-reviewer-2026' },
	author: { email: 'priya@lanternhill.example', password: 'demo-member-2026' },
	member: { email: 'jules@lanternhill.example', password: 'demo-member-2026' },
	unverified: { email: 'newcomer@lanternhill.example', password: 'demo-member-2026' }
};

const outboxDir = () => join(process.env.E2E_DATA_DIR!, 'outbox');

/** Raw text of every captured mail to `to`, oldest first (quoted-printable soft breaks undone). */
export function mailsTo(to: string): string[] {
	let files: string[];
	try {
		files = readdirSync(outboxDir())
			.filter((f) => f.endsWith('.eml'))
			.sort();
	} catch {
		return [];
	}
	return files
		.map((f) => readFileSync(join(outboxDir(), f), 'utf8'))
		.map((raw) => raw.replace(/=\r?\n/g, '').replace(/=3D/g, '='))
		.filter((raw) => new RegExp(`^To: .*${to.replace(/[.+]/g, '\\$&')}`, 'mi').test(raw));
}

export async function lastLinkTo(to: string, path: string): Promise<string> {
	let link: string | undefined;
	await expect
		.poll(() => {
			const mails = mailsTo(to);
			const m = mails
				.at(-1)
				?.match(new RegExp(`https?://[^\\s]+${path.replace('/', '\\/')}[^\\s]*`));
			link = m?.[0];
			return link;
		})
		.toBeTruthy();
	return link!;
}

export async function signIn(page: Page, who: { email: string; password: string }) {
	await page.goto('/signin');
	await page.getByLabel('E-mail').fill(who.email);
	await page.getByLabel('Password').fill(who.password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page.getByTestId('signed-in-as')).toBeVisible();
}

export const unique = (prefix: string) =>
	`${prefix}-${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}`;

export const BASE = `http://localhost:${process.env.E2E_PORT ?? 4173}`;

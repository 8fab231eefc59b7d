// Signing up in the browser: the form answers "check your inbox" for every address; the mailed link confirms and signs in.
import { expect, type Page } from '@playwright/test';
import { readFile } from 'node:fs/promises';
import { join, resolve } from 'node:path';

/** The fake SMTP server's mailbox (bootstrap sets MAILBOX_DIR for the app and the tests alike). */
const mailboxDir = resolve(process.env.MAILBOX_DIR ?? join('.data', 'mailbox'));

type Summary = { id: string; to: string[]; subject: string };

/** The first link in the newest mail to `to` whose subject matches, waiting for it to arrive. */
export async function linkInMailTo(to: string, subject: RegExp): Promise<string> {
	let href: string | undefined;
	await expect
		.poll(
			async () => {
				const index: Summary[] = JSON.parse(await readFile(join(mailboxDir, 'index.json'), 'utf8').catch(() => '[]'));
				const hit = index.filter((m) => m.to.includes(to.toLowerCase()) && subject.test(m.subject)).at(-1);
				if (!hit) return undefined;
				const message = JSON.parse(await readFile(join(mailboxDir, `${hit.id}.json`), 'utf8')) as { text: string };
				href = message.text.match(/https?:\/\/\S+/)?.[0];
				return href;
			},
			{ message: `a mail to ${to} matching ${subject}` }
		)
		.toBeTruthy();
	return href!;
}

/** Fills the sign-up form (on the page it is already on, or /signup) and waits for the "check your inbox" page. */
export async function fillSignUp(page: Page, name: string, email: string, password: string): Promise<void> {
	if (!new URL(page.url(), 'http://x').pathname.startsWith('/signup')) await page.goto('/signup');
	await page.getByLabel('Your name').fill(name);
	await page.getByLabel('E-mail', { exact: true }).fill(email);
	await page.getByLabel('Password', { exact: true }).fill(password);
	await page.getByRole('button', { name: 'Create account' }).click();
	await expect(page).toHaveURL(/\/signup\/sent$/);
	await expect(page.getByRole('heading', { name: 'Check your inbox' })).toBeVisible();
}

/** Signs up and follows the confirmation link from the mailbox, which signs the new learner in. */
export async function signUpAndConfirm(page: Page, name: string, email: string, password: string): Promise<void> {
	await fillSignUp(page, name, email, password);
	await page.goto(await linkInMailTo(email, /^Confirm your e-mail address/));
	await page.getByRole('button', { name: 'Confirm my address' }).click();
}

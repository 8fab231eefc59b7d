import { expect, test, type Browser, type Page } from '@playwright/test';
import { readFileSync } from 'node:fs';
import { fillSignUp, linkInMailTo, signUpAndConfirm } from './support/sign-up';

type Demo = { role: string; email: string; password: string };
const demo: Demo[] = JSON.parse(readFileSync('scripts/demo-accounts.json', 'utf8'));
const account = (role: string) => demo.find((d) => d.role === role)!;

async function signIn(page: Page, email: string, password: string) {
	if (!page.url().includes('/signin')) await page.goto('/signin');
	await page.getByLabel('E-mail', { exact: true }).fill(email);
	await page.getByLabel('Password', { exact: true }).fill(password);
	await page.getByRole('button', { name: 'Sign in' }).click();
}

/** An admin, in a browser of their own, opens the demo mailbox and reads the link out of the newest mail to `to`. */
async function linkFromMailbox(browser: Browser, to: string, subject: string): Promise<string> {
	const context = await browser.newContext();
	const admin = await context.newPage();
	const { email, password } = account('admin');
	await admin.goto('/signin?redirectTo=/admin/mailbox');
	await signIn(admin, email, password);
	await expect(admin).toHaveURL(/\/admin\/mailbox$/);
	await admin.getByRole('listitem').filter({ hasText: to }).filter({ hasText: subject }).first().getByRole('link').click();
	await expect(admin.getByRole('heading', { level: 1 })).toHaveText(subject);
	const href = await admin.getByTestId('mail-text').getByRole('link').first().getAttribute('href');
	await context.close();
	expect(href).toBeTruthy();
	return href!;
}

const unique = () => `${Date.now()}-${Math.floor(Math.random() * 1e6)}`;

test('sign up → verify from the mailbox, which signs in → sign out → sign in', async ({ page, browser }) => {
	const email = `e2e-${unique()}@test.example`;
	const password = 'sandbags in the wind';
	await fillSignUp(page, 'Kai Rowan', email, password);
	// the form signs nobody in: the same page answers a new and a taken address
	const header = page.getByRole('navigation', { name: 'Main' });
	await expect(header.getByRole('link', { name: 'Sign in' })).toBeVisible();

	const link = await linkFromMailbox(browser, email, 'Confirm your e-mail address for Stopwise');
	await page.goto(link);
	await page.getByRole('button', { name: 'Confirm my address' }).click();
	await expect(page.getByText(`${email} is verified`)).toBeVisible();
	await expect(header.getByRole('link', { name: /Kai Rowan/ })).toBeVisible();

	await header.getByRole('button', { name: 'Sign out' }).click();
	await expect(page).toHaveURL(/\/signin/);
	await expect(header.getByRole('link', { name: 'Sign in' })).toBeVisible();

	await signIn(page, email, password);
	await expect(header.getByRole('link', { name: 'Kai Rowan' })).toBeVisible();
	await page.goto('/account');
	await expect(page.getByText('verified', { exact: true })).toBeVisible();

	// the same link a second time is spent
	await page.goto(link);
	await expect(page.getByRole('heading', { name: 'This link no longer works' })).toBeVisible();
});

test('signing up with a taken address answers exactly as for a new one; the owner is told by e-mail', async ({ page }) => {
	const { email } = account('learner');
	await fillSignUp(page, 'Not The Owner', email, 'someone else entirely');
	await expect(page.getByTestId('signup-sent')).toContainText('If the address is new to Stopwise');
	expect(await linkInMailTo(email, /^Someone tried to create a Stopwise account/)).toMatch(/\/signin$/);
});

test('a wrong password gets one plain message next to the form', async ({ page }) => {
	await signIn(page, account('learner').email, 'not the password');
	await expect(page.getByRole('alert')).toHaveText('That e-mail address and password do not match an account.');
	await expect(page.getByLabel('Password', { exact: true })).toHaveValue('');
});

test('password reset end to end; the link works once', async ({ page, browser }) => {
	const email = `e2e-reset-${unique()}@test.example`;
	await signUpAndConfirm(page, 'Noor Vale', email, 'first passphrase here');
	await page.getByRole('navigation', { name: 'Main' }).getByRole('button', { name: 'Sign out' }).click();

	await page.getByRole('link', { name: 'Forgot your password?' }).click();
	// the sign-in page has an E-mail field too: wait for the reset page before typing
	await expect(page.getByRole('heading', { name: 'Reset your password' })).toBeVisible();
	await page.getByLabel('E-mail', { exact: true }).fill(email);
	await page.getByRole('button', { name: 'Send me a link' }).click();
	await expect(page.getByRole('status')).toContainText('a link to choose a new password is on its way');

	const link = await linkFromMailbox(browser, email, 'Choose a new Stopwise password');
	await page.goto(link);
	await page.getByLabel('New password').fill('second passphrase here');
	await page.getByRole('button', { name: 'Save the new password' }).click();
	await expect(page).toHaveURL(/\/signin\?notice=password-changed/);
	await expect(page.getByRole('status')).toContainText('Your password is changed');

	await signIn(page, email, 'first passphrase here');
	await expect(page.getByRole('alert')).toContainText('do not match');
	await signIn(page, email, 'second passphrase here');
	await expect(page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Noor Vale' })).toBeVisible();

	await page.goto(link);
	await expect(page.getByRole('heading', { name: 'Reset your password' })).toBeVisible();
	await expect(page.getByRole('alert')).toContainText('expired or has been used already');
});

test('a learner cannot open admin or mentor pages, nor the admin API', async ({ page }) => {
	const { email, password } = account('learner');
	await page.goto('/admin/people');
	await expect(page).toHaveURL(/\/signin\?redirectTo=%2Fadmin%2Fpeople$/);
	await signIn(page, email, password);
	// sent back to where they wanted to go, which is not for them
	await expect(page.getByRole('heading', { name: 'This page is for admins.' })).toBeVisible();

	for (const [path, text] of [
		['/admin/people', 'This page is for admins.'],
		['/admin/mailbox', 'This page is for admins.'],
		['/admin/audit', 'This page is for admins.'],
		['/mentor', 'This page is for mentors.']
	]) {
		const response = await page.goto(path);
		expect(response?.status(), path).toBe(403);
		await expect(page.getByRole('heading', { name: text })).toBeVisible();
	}
	const header = page.getByRole('navigation', { name: 'Main' });
	await expect(header.getByRole('link', { name: 'People' })).toHaveCount(0);
	await expect(header.getByRole('link', { name: 'Review queue' })).toHaveCount(0);

	const api = await page.request.get('/api/v1/admin/people');
	expect(api.status()).toBe(403);
	expect(await api.json()).toMatchObject({ error: 'forbidden' });
	const me = await page.request.get('/api/v1/me');
	expect(await me.json()).toMatchObject({ email, roles: ['learner'] });
});

test('an admin sees People and Mailbox, searches people and reads the role log', async ({ page }) => {
	const { email, password } = account('admin');
	await page.goto('/signin');
	await signIn(page, email, password);
	const header = page.getByRole('navigation', { name: 'Main' });
	await header.getByRole('link', { name: 'People' }).click();
	await expect(page.getByRole('heading', { name: 'People', level: 1 })).toBeVisible();
	await page.getByLabel('Search by name or e-mail').fill('mentor@harborlane');
	await page.getByRole('button', { name: 'Search' }).click();
	await expect(page).toHaveURL(/q=mentor%40harborlane/);
	await expect(page.getByRole('row')).toHaveCount(2);
	await expect(page.getByRole('cell', { name: 'mentor@harborlane.example' })).toBeVisible();
	await page.getByRole('link', { name: 'Audit log' }).click();
	await expect(page.getByRole('heading', { name: 'Audit log' })).toBeVisible();
	await expect(header.getByRole('link', { name: 'Mailbox' })).toBeVisible();
});

test('sign-in and its errors work without JavaScript', async ({ browser }) => {
	const context = await browser.newContext({ javaScriptEnabled: false });
	const page = await context.newPage();
	const { email, password } = account('mentor');
	await page.goto('/signin?redirectTo=/mentor');
	await signIn(page, email, 'not the password');
	await expect(page.getByRole('alert')).toHaveText('That e-mail address and password do not match an account.');
	await page.getByLabel('E-mail', { exact: true }).fill('');
	await signIn(page, '', password);
	await expect(page.getByText('Enter your e-mail address.')).toBeVisible();
	await signIn(page, email, password);
	await expect(page).toHaveURL(/\/mentor$/);
	await expect(page.getByRole('heading', { name: 'Review queue' })).toBeVisible();
	await page.getByRole('navigation', { name: 'Main' }).getByRole('button', { name: 'Sign out' }).click();
	await expect(page).toHaveURL(/\/signin\?notice=signed-out$/);
	await context.close();
});

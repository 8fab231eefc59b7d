// A learner files a Shoot Plan → a mentor sends it back with a note → the learner revises it → the mentor approves → uploads open.
import { expect, test, type Page } from '@playwright/test';
import { readFileSync } from 'node:fs';
import postgres from 'postgres';
import { linkInMailTo, signUpAndConfirm } from './support/sign-up';

type Demo = { role: string; email: string; password: string };
const demo: Demo[] = JSON.parse(readFileSync('scripts/demo-accounts.json', 'utf8'));
const account = (role: string) => demo.find((d) => d.role === role)!;
const sql = postgres(process.env.DATABASE_URL ?? 'postgres://stopwise@127.0.0.1:54329/stopwise', { max: 2, onnotice: () => {} });
const ASSIGNMENT = '/courses/daylight-flash-for-action/rembrandt-on-the-move/assignments/rembrandt-in-motion';
const email = `e2e-plan-${Date.now().toString(36)}@test.example`;
const name = `Plan Tester ${Date.now().toString(36)}`;

async function signInMentor(page: Page) {
	const { email: mentor, password } = account('mentor');
	await page.goto(`/signin?redirectTo=${encodeURIComponent('/mentor')}`);
	await page.getByLabel('E-mail', { exact: true }).fill(mentor);
	await page.getByLabel('Password', { exact: true }).fill(password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page.getByTestId('plans-waiting')).toContainText(/Shoot Plans? waits? for approval/);
}

async function openPlan(page: Page) {
	await page.goto('/mentor/plans');
	await expect(page.getByRole('heading', { name: 'Shoot Plans waiting' })).toBeVisible();
	await page.getByRole('link', { name: `${name}: Rembrandt in motion` }).click();
}

test.afterAll(async () => {
	await sql`delete from audit_log where subject like ${`${email}:%`}`;
	await sql.end();
});

test('a Shoot Plan is filed, sent back, revised and approved; then the uploads open', async ({ page, browser }) => {
	test.setTimeout(120_000);
	await signUpAndConfirm(page, name, email, 'sandbag every stand');
	await sql`insert into enrolments (user_id, course_id, source)
		select u.id, c.id, 'admin' from users u, courses c where u.email = ${email} and c.slug = 'daylight-flash-for-action'`;

	await page.goto(ASSIGNMENT);
	const panel = page.getByTestId('shoot-plan');
	await expect(page.getByText('Uploads open once a mentor approves your Shoot Plan.')).toBeVisible();
	await panel.getByLabel('Shutter').fill('1/250');
	await panel.getByLabel('Aperture').fill('f/8');
	await panel.getByLabel('ISO').fill('200');
	await panel.getByLabel('Where, who and how').fill('The climber reaches from the third hold; the stand is left of the wall, outside the mats.');
	await panel.getByRole('button', { name: 'File the plan' }).click();
	await expect(panel.getByRole('alert')).toContainText('Confirm every line of the safety checklist');
	for (const box of await panel.getByRole('group', { name: 'Safety checklist' }).getByRole('checkbox').all()) await box.check();
	await panel.getByRole('button', { name: 'File the plan' }).click();
	await expect(panel.getByRole('status').filter({ hasText: 'Plan filed.' })).toBeVisible();
	await expect(panel.getByText(/Waiting for a mentor since/)).toBeVisible();

	const mentorContext = await browser.newContext();
	const mentor = await mentorContext.newPage();
	await signInMentor(mentor);
	await openPlan(mentor);
	await expect(mentor.getByText('The climber reaches from the third hold')).toBeVisible();
	await mentor.getByLabel('Send back with a note').check();
	await mentor.getByRole('button', { name: 'Send it back' }).click();
	await expect(mentor.getByText('Say what to change before sending the plan back.')).toBeVisible();
	await mentor.getByLabel(/Note to the learner/).fill('Guy the stand and keep a helper on it.');
	await mentor.getByRole('button', { name: 'Send it back' }).click();
	await expect(mentor.getByRole('status').filter({ hasText: 'Sent back with your note.' })).toBeVisible();

	// the learner follows the mail, revises and files again
	await page.goto(await linkInMailTo(email, /Your Shoot Plan came back with a note/));
	await expect(panel.getByText('Guy the stand and keep a helper on it.')).toBeVisible();
	await panel.getByLabel('Where, who and how').fill('The stand is guyed, 3 m left of the wall and outside the mats; a helper stays with it.');
	for (const box of await panel.getByRole('group', { name: 'Safety checklist' }).getByRole('checkbox').all()) await box.check();
	await panel.getByRole('button', { name: 'File the plan' }).click();
	await expect(panel.getByText(/Waiting for a mentor since/)).toBeVisible();

	await openPlan(mentor);
	await expect(mentor.getByText('The stand is guyed, 3 m left of the wall')).toBeVisible();
	await mentor.getByRole('button', { name: 'Approve the plan' }).click();
	await expect(mentor.getByRole('status').filter({ hasText: 'Approved: their uploads are open.' })).toBeVisible();
	await mentorContext.close();

	await page.reload();
	await expect(panel.getByText(/Approved by/)).toBeVisible();
	await expect(page.getByText('Uploads open once a mentor approves your Shoot Plan.')).toHaveCount(0);
	await expect(page.getByTestId('frame-input-reference')).toBeAttached();
});

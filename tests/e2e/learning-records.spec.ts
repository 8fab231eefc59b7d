// A learner's lesson, completed by its quizzes, reaches the Learning Record Store fake as xAPI statements, each once;
// the admin page shows them sent.
import { expect, test } from '@playwright/test';
import postgres from 'postgres';
import { signUpAndConfirm } from './support/sign-up';
import { expectVerbsFor } from './support/lrs';
import { COURSE, demoAccount } from './support/screens';

const LESSON = 'what-a-stop-is';
const ADL = 'http://adlnet.gov/expapi/verbs/';
const sql = postgres(process.env.DATABASE_URL ?? 'postgres://stopwise@127.0.0.1:54329/stopwise', { max: 2, onnotice: () => {} });

test.describe.configure({ timeout: 120_000 });

test.afterAll(async () => {
	await sql.end();
});

test('a lesson completed by its quizzes reaches the LRS as answered and completed statements, once each', async ({ page, browser }) => {
	const email = `records-${Date.now()}@test.example`;
	await signUpAndConfirm(page, 'Rowan Tide', email, 'a long test passphrase');
	const [{ id: userId }] = await sql<{ id: string }[]>`select id from users where email = ${email}`;

	// the first lesson is open to every signed-in learner; both its quizzes answered right complete it
	await page.goto(`/courses/${COURSE}/${LESSON}`);
	const quizzes = page.getByTestId('quiz-form');
	await quizzes.nth(0).getByTestId('quiz-answer').fill('3');
	await quizzes.nth(0).getByTestId('quiz-check').click();
	await expect(page.getByTestId('quiz-saving').nth(0)).toHaveText('Answer saved.');
	await quizzes.nth(1).getByRole('radio', { name: 'It drops to a quarter' }).check();
	await quizzes.nth(1).getByTestId('quiz-check').click();
	await expect(page.getByTestId('quiz-saving').nth(1)).toHaveText('Answer saved.');

	const lessonIri = new RegExp(`/xapi/activities/lesson/${COURSE}/${LESSON}$`);
	const held = await expectVerbsFor(userId, [`${ADL}answered`, `${ADL}completed`]);
	expect(held.filter((s) => s.verb.id === `${ADL}answered`)).toHaveLength(2);
	const completed = held.filter((s) => s.verb.id === `${ADL}completed`);
	expect(completed).toHaveLength(1);
	expect(completed[0].object.id).toMatch(lessonIri);

	// the admin sees the statements sent and nothing left waiting for this learner
	const context = await browser.newContext();
	const admin = await context.newPage();
	await admin.goto('/signin?redirectTo=/admin/learning-records');
	await admin.getByLabel('E-mail', { exact: true }).fill(demoAccount('admin').email);
	await admin.getByLabel('Password', { exact: true }).fill(demoAccount('admin').password);
	await admin.getByRole('button', { name: 'Sign in' }).click();
	await expect(admin.getByRole('heading', { level: 1 })).toHaveText('Learning records');
	await expect(admin.getByRole('region', { name: 'Statements sent', exact: true })).toContainText('Rowan Tide');
	await admin.getByRole('button', { name: 'Retry now' }).click();
	await expect(admin.getByRole('status').filter({ hasText: 'Sending the backlog now.' })).toBeVisible();
	await context.close();
});

import { expect, test, type Page } from '@playwright/test';
import { readFileSync } from 'node:fs';

type Demo = { role: string; email: string; password: string };
const demo: Demo[] = JSON.parse(readFileSync('scripts/demo-accounts.json', 'utf8'));
const account = (role: string) => demo.find((d) => d.role === role)!;

async function signInAs(page: Page, role: string, redirectTo: string) {
	const { email, password } = account(role);
	await page.goto(`/signin?redirectTo=${encodeURIComponent(redirectTo)}`);
	await page.getByLabel('E-mail', { exact: true }).fill(email);
	await page.getByLabel('Password', { exact: true }).fill(password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).toHaveURL(new RegExp(`${redirectTo.replace(/[/?]/g, '\\$&')}$`));
}

async function signOut(page: Page) {
	await page.getByRole('navigation', { name: 'Main' }).getByRole('button', { name: 'Sign out' }).click();
	await expect(page).toHaveURL(/\/signin/);
}

const LESSON_TEXT = `The rowing dock has no walls to bounce from: a small flash has to work close.

<FalloffRuler gn="60" power="1/4" distance="3" iso="100" aperture="8" />

<Quiz id="reach-1" question="A flash rated GN 60 is set to 1/4 power. What is its guide number now?" answer="30" tolerance="0.5" unit="m" />
`;

test('an author writes, previews and publishes a lesson; a learner uses its widgets and keeps a quiz answer', async ({ page }) => {
	test.setTimeout(90_000);
	const title = `Reach at the dock ${Date.now().toString(36)}`;

	// the author writes the lesson in the browser
	await signInAs(page, 'author', '/author');
	const module = page.getByTestId('author-module').filter({ hasText: 'Bringing your own light' });
	await module.getByRole('link', { name: 'New lesson' }).click();
	await page.getByLabel('Title').fill(title);
	await page.getByLabel('Open lesson').check();
	await page.getByRole('button', { name: 'Create lesson' }).click();
	await expect(page).toHaveURL(/\/author\/lessons\/\d+\?notice=created$/);
	const editorUrl = page.url().replace(/\?.*$/, '');

	await page.getByLabel('Lesson text (Markdown)').fill(LESSON_TEXT);
	// the live preview renders the widgets, working, before anything is saved
	const preview = page.getByTestId('lesson-preview');
	await expect(preview.getByRole('region', { name: 'Falloff Ruler' })).toBeVisible();
	await expect(preview.getByTestId('quiz-question')).toHaveText(/GN 60 is set to 1\/4 power/);
	await expect(preview.getByTestId('falloff-gn-now')).toHaveText('30.0 m');
	await expect(preview.getByTestId('preview-problems')).toHaveCount(0);

	await page.getByRole('button', { name: 'Publish' }).click();
	await expect(page.getByText('Published: learners now see this version.')).toBeVisible();
	const lessonHref = await page.getByRole('link', { name: 'View as a learner' }).getAttribute('href');
	expect(lessonHref).toMatch(/^\/courses\/daylight-flash-for-action\/reach-at-the-dock-/);
	await signOut(page);

	// a learner opens it (an open lesson, so no enrolment is needed) and drags the distance slider
	await signInAs(page, 'learner', '/courses');
	await page.goto(lessonHref!);
	await expect(page.getByRole('heading', { level: 1 })).toHaveText(title);
	const stops = page.getByTestId('falloff-stops');
	const before = await stops.textContent();
	const slider = page.getByTestId('falloff-distance');
	const box = (await slider.boundingBox())!;
	await page.mouse.move(box.x + box.width * 0.14, box.y + box.height / 2);
	await page.mouse.down();
	await page.mouse.move(box.x + box.width * 0.6, box.y + box.height / 2, { steps: 8 });
	await page.mouse.up();
	await expect(stops).not.toHaveText(before!);
	await expect(page.getByTestId('falloff-distance-value')).not.toHaveText('3.0 m');

	// the quiz answer is saved and comes back after a reload
	await page.getByTestId('quiz-answer').fill('30');
	await page.getByTestId('quiz-check').click();
	await expect(page.getByTestId('quiz-result')).toContainText('Right');
	await expect(page.getByTestId('quiz-saving')).toHaveText('Answer saved.');
	// its only quiz answered right: the lesson shows complete at once, without a reload
	await expect(page.getByTestId('lesson-complete')).toBeVisible();
	await page.reload();
	await expect(page.getByTestId('quiz-answer')).toHaveValue('30');
	await expect(page.getByTestId('quiz-result')).toContainText('Right: the answer is 30 m');
	await expect(page.getByTestId('quiz-saving')).toHaveText('Your saved answer.');
	// every quiz answered right completes the lesson
	await expect(page.getByTestId('lesson-complete')).toBeVisible();
	await signOut(page);

	// tidy up: the author unpublishes and deletes the lesson
	await signInAs(page, 'author', new URL(editorUrl).pathname);
	await page.getByRole('button', { name: 'Unpublish' }).click();
	await expect(page.getByText('Unpublished: learners no longer see this lesson.')).toBeVisible();
	page.once('dialog', (dialog) => void dialog.accept());
	await page.getByRole('button', { name: 'Delete lesson' }).click();
	await expect(page).toHaveURL(/\/author\?deleted=/);
	await expect(page.getByText(`Deleted “${title}”.`)).toBeVisible();
	expect((await page.request.get(lessonHref!)).status()).toBe(404);
});

// Every main learner page, on a desktop and on a 390 px phone, saved under test-results/learner-screens/ to be looked at;
// on the way, the pages say what they must: the course guide, numbered Attempts grouped by Assignment, no broken images.
import { devices, expect as baseExpect, test, type Browser, type BrowserContext, type Page } from '@playwright/test';
import { randomUUID } from 'node:crypto';
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import postgres from 'postgres';
import { makeFrame, REFERENCE_EXIF } from '../../src/lib/server/analysis/test-frames';
import { signUpAndConfirm } from './support/sign-up';

const COURSE = 'daylight-flash-for-action';
const LESSON = 'off-the-axis';
const SHOTS = join('test-results', 'learner-screens');
const sql = postgres(process.env.DATABASE_URL ?? 'postgres://stopwise@127.0.0.1:54329/stopwise', { max: 2, onnotice: () => {} });
const expect = baseExpect.configure({ timeout: 20_000 });
const email = `e2e-screens-${Date.now()}@test.example`;
const password = 'sandbag every stand';
const { defaultBrowserType: _browser, ...pixel } = devices['Pixel 7'];
const phone = { ...pixel, viewport: { width: 390, height: 844 } };

test.describe.configure({ mode: 'serial', timeout: 240_000 });
test.afterAll(async () => {
	await sql`delete from users where email = ${email}`;
	await sql.end();
});

async function shoot(page: Page, name: string) {
	mkdirSync(SHOTS, { recursive: true });
	await page.screenshot({ path: join(SHOTS, `${name}.png`), fullPage: true });
}

/** A pair for "Off the axis": reference 1/500 s, lit 1/1500 s (log2 3 ≈ 1.6 stops under, APEX), flash fired or not. */
async function framePair(flash: number) {
	const reference = await makeFrame({ width: 900, height: 600, subject: { stops: 0 }, background: { stops: 0.5 }, exif: { ...REFERENCE_EXIF } });
	const lit = await makeFrame({ width: 900, height: 600, subject: { stops: 0 }, background: { stops: 0.5 - Math.log2(3) }, exif: { ...REFERENCE_EXIF, exposureTime: 1 / 1500, flash } });
	return { reference, lit };
}

async function sendAttempt(page: Page, flash: number): Promise<string> {
	const { reference, lit } = await framePair(flash);
	const base = new URL(page.url()).origin;
	const answer = await page.request.post('/api/v1/attempts', {
		headers: { origin: base },
		multipart: {
			assignment: LESSON,
			submissionKey: randomUUID(),
			subjectBox: '0.3,0.25,0.4,0.5',
			lightPlan: '',
			'frame:reference': { name: 'reference.jpg', mimeType: 'image/jpeg', buffer: reference },
			'frame:lit': { name: 'lit.jpg', mimeType: 'image/jpeg', buffer: lit }
		}
	});
	expect(answer.status()).toBe(201);
	return ((await answer.json()) as { href: string }).href;
}

async function signedIn(browser: Browser, options: object): Promise<{ context: BrowserContext; page: Page }> {
	const context = await browser.newContext(options);
	const page = await context.newPage();
	await page.goto('/signin');
	await page.getByLabel('E-mail', { exact: true }).fill(email);
	await page.getByLabel('Password', { exact: true }).fill(password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).not.toHaveURL(/\/signin/);
	return { context, page };
}

let attemptHref = '';

test('a new visitor sees the course guide, then signs up, enrols and sends two Attempts', async ({ page }) => {
	await page.goto(`/courses/${COURSE}`);
	const guide = page.getByTestId('course-guide');
	await expect(guide).toHaveAttribute('open', '');
	await expect(guide.getByRole('heading', { name: 'How grading works' })).toBeVisible();
	const blue = guide.getByTestId('guide-assignments').getByRole('listitem').filter({ hasText: 'Blue hour at noon' }).first();
	await expect(blue).toContainText('“reference”, “lit”');
	await expect(blue.locator('[data-gear="gel"]')).toHaveCount(1);
	await expect(blue.locator('[data-gear="stand"]')).toHaveCount(1);
	await expect(blue.locator('[data-gear="trigger"]')).toHaveCount(1);

	await page.getByRole('link', { name: 'Create an account' }).click();
	await expect(page).toHaveURL(/\/signup\?redirectTo=%2Fcourses%2Fdaylight-flash-for-action$/);
	// the mailed link confirms the address, signs in and comes back to the course
	await signUpAndConfirm(page, 'Sam Okoro', email, password);
	await expect(page).toHaveURL(new RegExp(`/courses/${COURSE}$`));
	await sql`insert into enrolments (user_id, course_id, source) select u.id, c.id, 'admin' from users u, courses c where u.email = ${email} and c.slug = ${COURSE}`;

	// two Attempts, so the progress page has a group to number: the first file without a flash record, the second with one
	await page.goto(`/courses/${COURSE}/${LESSON}`);
	await sendAttempt(page, 0x10);
	attemptHref = await sendAttempt(page, 0x19);
	await page.goto(attemptHref);
	await expect(page.getByTestId('verdict-badge').first()).toHaveText('Passed', { timeout: 60_000 });
});

test('progress lists Attempts by Assignment, numbered and dated', async ({ browser }) => {
	const { context, page } = await signedIn(browser, {});
	await page.goto('/progress');
	const group = page.getByTestId('progress-group').filter({ hasText: 'Off the axis' });
	await expect(group).toHaveCount(1);
	await expect(group.getByTestId('progress-attempt')).toHaveCount(2, { timeout: 60_000 });
	await expect(group.getByTestId('progress-attempt').first()).toContainText('Attempt 2');
	await expect(group.getByTestId('progress-attempt').last()).toContainText('Attempt 1');
	const today = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeZone: 'UTC' }).format(new Date());
	await expect(group.getByTestId('progress-attempt').first()).toContainText(today);
	await context.close();
});

test('an unreadable photo gets a placeholder and a message, not a broken image', async ({ browser }) => {
	const { context, page } = await signedIn(browser, {});
	await page.goto(`/courses/${COURSE}/${LESSON}/assignments/${LESSON}`);
	const junk = Buffer.from('this is not really a JPEG at all, only its name says so'.repeat(20));
	await page.getByTestId('frame-input-lit').setInputFiles({ name: 'lit.jpg', mimeType: 'image/jpeg', buffer: junk });
	await expect(page.getByTestId('frame-no-preview-lit')).toBeVisible();
	await expect(page.getByTestId('subject-box-unavailable')).toContainText('cannot show the frame');
	const broken = await page.locator('img').evaluateAll((images) => images.filter((i) => (i as HTMLImageElement).complete && (i as HTMLImageElement).naturalWidth === 0).length);
	expect(broken).toBe(0);
	await shoot(page, 'desktop-upload-unreadable-file');
	await context.close();
});

for (const [device, options] of [
	['desktop', {}],
	['phone', phone]
] as const) {
	test(`screenshots of every main learner page (${device})`, async ({ browser }) => {
		const visitor = await browser.newContext(options);
		const anon = await visitor.newPage();
		await anon.goto('/');
		await shoot(anon, `${device}-01-home`);
		await anon.goto(`/courses/${COURSE}/inverse-square`);
		await expect(anon.getByTestId('signin-reason')).toHaveText('Sign in to open this lesson.');
		await shoot(anon, `${device}-02-sign-in-with-reason`);
		await visitor.close();

		const { context, page } = await signedIn(browser, options);
		const pages: [string, string, string][] = [
			['03-catalogue', '/courses', 'Courses'],
			['04-course', `/courses/${COURSE}`, 'Daylight Flash for Action'],
			['05-lesson', `/courses/${COURSE}/what-a-stop-is`, 'What a stop is'],
			['06-lesson-with-assignment', `/courses/${COURSE}/${LESSON}`, 'Off the camera axis'],
			['07-upload', `/courses/${COURSE}/${LESSON}/assignments/${LESSON}`, 'Off the axis'],
			['08-verdict', attemptHref, 'Off the axis'],
			['09-progress', '/progress', 'Your progress'],
			['10-account', '/account', ''],
			['11-billing', '/account/billing', '']
		];
		for (const [name, path, heading] of pages) {
			await page.goto(path);
			if (heading) await expect(page.getByRole('heading', { level: 1 })).toHaveText(heading);
			// nothing wider than the screen
			const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
			expect.soft(overflow, `${name} overflows by ${overflow}px`).toBeLessThanOrEqual(0);
			await shoot(page, `${device}-${name}`);
		}
		await context.close();
	});
}

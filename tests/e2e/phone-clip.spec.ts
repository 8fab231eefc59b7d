// On a phone: an enrolled learner plays the demo lesson's clip (the smaller rendition, captions on, a captions button);
// a visitor and a learner who has not paid get no clip at all, and the clip's address refuses them.
import { expect, test } from '@playwright/test';
import postgres from 'postgres';
import { COURSE, demoAccount } from './support/screens';

const learner = demoAccount('learner');
const LESSON_PATH = `/courses/${COURSE}/metering-and-going-under`;
const sql = postgres(process.env.DATABASE_URL ?? 'postgres://stopwise@127.0.0.1:54329/stopwise', { max: 2, onnotice: () => {} });
let learnerId = '';
let courseId = 0;
let clipId = '';

test.beforeAll(async () => {
	[{ id: learnerId }] = await sql<{ id: string }[]>`select id from users where email = ${learner.email}`;
	[{ id: courseId }] = await sql<{ id: number }[]>`select id from courses where slug = ${COURSE}`;
	[{ id: clipId }] = await sql<{ id: string }[]>`select id from lesson_clips where name = 'dim-then-light' and status = 'ready'`;
});

test.afterAll(async () => {
	await sql`delete from enrolments where user_id = ${learnerId} and course_id = ${courseId} and source = 'admin'`;
	await sql.end();
});

async function signIn(page: import('@playwright/test').Page) {
	await page.goto(`/signin?redirectTo=${encodeURIComponent(LESSON_PATH)}`);
	await page.getByLabel('E-mail', { exact: true }).fill(learner.email);
	await page.getByLabel('Password', { exact: true }).fill(learner.password);
	await page.getByRole('button', { name: 'Sign in' }).click();
}

test('an enrolled learner plays the lesson clip on a phone, with captions they can turn off', async ({ page }) => {
	await sql`insert into enrolments (user_id, course_id, source) values (${learnerId}, ${courseId}, 'admin') on conflict do nothing`;
	await signIn(page);
	await expect(page).toHaveURL(new RegExp(`${LESSON_PATH}$`));
	const clip = page.getByRole('region', { name: 'Clip' });
	const video = clip.getByTestId('clip-video');
	await video.scrollIntoViewIfNeeded();
	await expect(video).toBeVisible();
	// the captions track is there and shown; nothing plays by itself
	await expect(video.locator('track[kind="captions"]')).toHaveCount(1);
	expect(await video.evaluate((v: HTMLVideoElement) => ({ paused: v.paused, autoplay: v.autoplay }))).toEqual({ paused: true, autoplay: false });
	await expect.poll(() => video.evaluate((v: HTMLVideoElement) => v.textTracks[0]?.mode)).toBe('showing');

	// the learner starts it (the player's own control): it plays, from the smaller file on a narrow screen
	await video.click();
	await expect.poll(() => video.evaluate((v: HTMLVideoElement) => v.currentTime), { timeout: 30_000 }).toBeGreaterThan(0.5);
	expect(await video.evaluate((v: HTMLVideoElement) => v.currentSrc)).toMatch(new RegExp(`/api/v1/clips/${clipId}/360\\.mp4$`));
	await expect.poll(() => video.evaluate((v: HTMLVideoElement) => v.textTracks[0]?.cues?.length ?? 0)).toBeGreaterThan(2);

	// the captions button, by keyboard
	const button = clip.getByRole('button', { name: /Captions/ });
	await expect(button).toHaveAttribute('aria-pressed', 'true');
	await button.focus();
	await page.keyboard.press('Enter');
	await expect(button).toHaveAttribute('aria-pressed', 'false');
	await expect.poll(() => video.evaluate((v: HTMLVideoElement) => v.textTracks[0]?.mode)).toBe('hidden');

	// the clip fits the phone's width
	const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
	expect(overflow).toBeLessThanOrEqual(0);
});

test('without paying there is no clip: the lesson page is not shown and the clip address refuses', async ({ page, request }) => {
	await sql`delete from enrolments where user_id = ${learnerId} and course_id = ${courseId} and source = 'admin'`;
	// a visitor: sent to sign in, and the clip's files answer 401
	const visitor = await request.get(`/api/v1/clips/${clipId}/360.mp4`, { headers: { range: 'bytes=0-99' } });
	expect(visitor.status()).toBe(401);
	// a signed-in learner without the course: the lesson offers enrolment instead, and the files answer 403
	await signIn(page);
	await expect(page).toHaveURL(new RegExp(`/courses/${COURSE}\\?locked=metering-and-going-under$`));
	await expect(page.locator('video')).toHaveCount(0);
	expect(await page.content()).not.toContain('/api/v1/clips/');
	const refused = await page.request.get(`/api/v1/clips/${clipId}/720.mp4`);
	expect(refused.status()).toBe(403);
});

// An author adds a clip in the browser: the video goes up, is prepared with progress, is placed by its tag, shows in the
// preview and, once the lesson is published, plays for a reader with its captions.
import { expect, test, type Page } from '@playwright/test';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runTool } from '../../src/lib/server/clips/ffmpeg';
import { demoAccount } from './support/screens';

const author = demoAccount('author');

let dir = '';
test.beforeAll(async () => {
	dir = await mkdtemp(join(tmpdir(), 'stopwise-e2e-clip-'));
	// a test pattern with a tone, 3 s: ffmpeg's own generators, nothing from elsewhere
	const made = await runTool(
		'ffmpeg',
		['-hide_banner', '-nostdin', '-y', '-f', 'lavfi', '-i', 'testsrc=size=640x360:rate=15:duration=3', '-f', 'lavfi', '-i', 'sine=frequency=330:duration=3', '-c:v', 'libx264', '-preset', 'ultrafast', '-pix_fmt', 'yuv420p', '-c:a', 'aac', join(dir, 'stands.mp4')],
		{ timeoutMs: 60_000 }
	);
	expect(made.code).toBe(0);
});
test.afterAll(() => rm(dir, { recursive: true, force: true }));

async function signIn(page: Page, redirectTo: string) {
	await page.goto(`/signin?redirectTo=${encodeURIComponent(redirectTo)}`);
	await page.getByLabel('E-mail', { exact: true }).fill(author.email);
	await page.getByLabel('Password', { exact: true }).fill(author.password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).toHaveURL(new RegExp(`${redirectTo.replace(/[/?]/g, '\\$&')}$`));
}

test('an author uploads a clip, watches it being prepared, places it and publishes; a reader plays it with captions', async ({ page, browser }) => {
	test.setTimeout(240_000);
	const stamp = Date.now().toString(36);
	const title = `Stands at the ramp ${stamp}`;
	const name = `stands-${stamp}`;

	await signIn(page, '/author');
	await page.getByTestId('author-module').filter({ hasText: 'Bringing your own light' }).getByRole('link', { name: 'New lesson' }).click();
	await page.getByLabel('Title').fill(title);
	await page.getByLabel('Open lesson').check();
	await page.getByRole('button', { name: 'Create lesson' }).click();
	await expect(page).toHaveURL(/\/author\/lessons\/\d+\?notice=created$/);

	const clips = page.getByTestId('clip-manager');
	// bad captions are refused in the page, before anything is sent
	await clips.getByLabel('Title').fill('Where the stands go');
	await clips.getByLabel('Name (for the tag)').fill(name);
	await clips.getByLabel('Video (MP4, MOV, WebM…)').setInputFiles(join(dir, 'stands.mp4'));
	await clips.getByLabel('…or write the captions (required)').fill('00:00.000 --> 00:02.000\nNo signature');
	await clips.getByRole('button', { name: 'Add and upload' }).click();
	await expect(clips.getByText('Captions must be WebVTT: the first line is “WEBVTT”.')).toBeVisible();

	await clips.getByLabel('…or write the captions (required)').fill('WEBVTT\n\n00:00.000 --> 00:01.500\nThe stand goes well outside the run-out.\n\n00:01.500 --> 00:03.000\nSandbag it: the wind picks up by the water.\n');
	await clips.getByRole('button', { name: 'Add and upload' }).click();
	// progress is shown while the video goes up and while it is prepared
	await expect(clips.getByTestId('clip-progress')).toBeVisible();
	await expect(clips.getByTestId('clip-status')).toContainText('is ready', { timeout: 180_000 });
	await expect(clips.getByTestId('clip-row').filter({ hasText: 'Where the stands go' })).toContainText('ready');

	// placed by its tag, it shows in the preview as learners will see it
	await page.getByLabel('Lesson text (Markdown)').fill(`Where the stands went, and why.\n\n<Clip name="${name}" />\n`);
	const preview = page.getByTestId('lesson-preview');
	await expect(preview.getByTestId('clip-video')).toBeVisible();
	await expect(preview.getByTestId('clip-title')).toHaveText('Where the stands go');

	await page.getByRole('button', { name: 'Publish' }).click();
	await expect(page.getByText('Published: learners now see this version.')).toBeVisible();
	const lessonHref = await page.getByRole('link', { name: 'View as a learner' }).getAttribute('href');

	// an open lesson: a visitor plays it, captions track and all
	const visitor = await browser.newPage();
	await visitor.goto(lessonHref!);
	const video = visitor.getByTestId('clip-video');
	await expect(video.locator('track[kind="captions"]')).toHaveCount(1);
	await video.click();
	await expect.poll(() => video.evaluate((v: HTMLVideoElement) => v.currentTime), { timeout: 30_000 }).toBeGreaterThan(0.3);
	expect(await video.evaluate((v: HTMLVideoElement) => v.currentSrc)).toMatch(/\/720\.mp4$/);
	await visitor.close();
});

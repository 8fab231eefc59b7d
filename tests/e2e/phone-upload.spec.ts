// On a phone: a 40 MB frame goes up in parts, the connection drops during one part, the upload resumes from what the
// server holds (not from zero) and the attempt is made; cancelling an upload leaves nothing on the server.
import { expect, test, type Page } from '@playwright/test';
import postgres from 'postgres';
import { UPLOAD_PART_BYTES } from '../../src/lib/attempts/upload-parts';
import { padJpeg } from '../../src/lib/server/attempts/uploads/padded-jpeg';
import { enrolDemoLearner, framePair } from './support/enrolled-learner';
import { COURSE, demoAccount, LESSON } from './support/screens';

const MB = 1024 * 1024;
const sql = postgres(process.env.DATABASE_URL ?? 'postgres://stopwise@127.0.0.1:54329/stopwise', { max: 2, onnotice: () => {} });
const learner = demoAccount('learner');
const enrolled = enrolDemoLearner();
test.afterAll(() => sql.end());

async function openUploadPage(page: Page) {
	const path = `/courses/${COURSE}/${LESSON}/assignments/${LESSON}`;
	await page.goto(`/signin?redirectTo=${encodeURIComponent(path)}`);
	await page.getByLabel('E-mail', { exact: true }).fill(learner.email);
	await page.getByLabel('Password', { exact: true }).fill(learner.password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page.getByRole('heading', { level: 1 })).toHaveText('Off the axis');
}

/** A passing pair for "Off the axis", the lit frame padded to 40 MB. */
async function pair() {
	const { reference, lit } = await framePair();
	return { reference, lit: padJpeg(lit, 40 * MB) };
}

test('a 40 MB frame survives a dropped connection and resumes where it stopped', async ({ page }) => {
	test.setTimeout(180_000);
	const { reference, lit } = await pair();
	expect(lit.length).toBe(40 * MB);
	await openUploadPage(page);

	// the connection drops during the second part of the big frame (only the 40 MB frame reaches one part's size)
	const patches: { url: string; offset: number; dropped: boolean }[] = [];
	let heads = 0;
	await page.route('**/api/v1/uploads/*', async (route) => {
		const request = route.request();
		if (request.method() === 'HEAD') heads++;
		if (request.method() !== 'PATCH') return route.continue();
		const offset = Number(request.headers()['upload-offset']);
		const drop = offset >= UPLOAD_PART_BYTES && !patches.some((p) => p.dropped);
		patches.push({ url: request.url(), offset, dropped: drop });
		if (drop) return route.abort('connectionreset');
		return route.continue();
	});

	await page.getByTestId('frame-input-reference').setInputFiles({ name: 'reference.jpg', mimeType: 'image/jpeg', buffer: reference });
	await page.getByTestId('frame-input-lit').setInputFiles({ name: 'lit.jpg', mimeType: 'image/jpeg', buffer: lit });
	await expect(page.getByTestId('frame-slot-lit')).toContainText('40 MB');
	await page.getByTestId('send-attempt').click();
	await expect(page.getByTestId('frame-progress-lit')).toBeVisible();

	await expect(page).toHaveURL(/\/attempts\/[0-9a-f-]{36}$/, { timeout: 150_000 });
	const cut = patches.find((p) => p.dropped);
	expect(cut, 'one part was cut off').toBeDefined();
	// the client asked the server how much it holds (HEAD) and carried on from there: never from zero again
	expect(heads).toBeGreaterThanOrEqual(1);
	const later = patches.slice(patches.indexOf(cut!) + 1).filter((p) => p.url === cut!.url);
	expect(later[0].offset).toBe(cut!.offset);
	expect(later.every((p) => p.offset >= cut!.offset)).toBe(true);
	expect(later.at(-1)!.offset).toBeGreaterThan(lit.length - UPLOAD_PART_BYTES - 1);

	const [frames] = await sql<{ n: number; bytes: number }[]>`
		select count(*)::int as n, max(bytes)::int as bytes from attempt_frames f join attempts a on a.id = f.attempt_id where a.user_id = ${enrolled.id}`;
	expect(frames).toEqual({ n: 2, bytes: 40 * MB });
	const [left] = await sql<{ n: number }[]>`select count(*)::int as n from frame_uploads where user_id = ${enrolled.id}`;
	expect(left.n).toBe(0);
});

test('cancelling an upload stops it and leaves nothing on the server', async ({ page }) => {
	test.setTimeout(120_000);
	const { reference, lit } = await pair();
	const attemptsNow = async () => (await sql<{ n: number }[]>`select count(*)::int as n from attempts where user_id = ${enrolled.id}`)[0].n;
	const before = await attemptsNow();
	await openUploadPage(page);
	// slow the parts down so there is time to cancel
	await page.route('**/api/v1/uploads/*', async (route) => {
		if (route.request().method() === 'PATCH') await new Promise((r) => setTimeout(r, 700));
		return route.continue().catch(() => undefined);
	});
	await page.getByTestId('frame-input-reference').setInputFiles({ name: 'reference.jpg', mimeType: 'image/jpeg', buffer: reference });
	await page.getByTestId('frame-input-lit').setInputFiles({ name: 'lit.jpg', mimeType: 'image/jpeg', buffer: lit });
	await page.getByTestId('send-attempt').click();
	// cancelled part-way through the big frame
	await expect(page.getByTestId('frame-progress-lit')).not.toHaveText('0%');
	await page.getByTestId('cancel-upload').click();
	await expect(page.getByText('Upload cancelled. Nothing was kept on the server')).toBeVisible();
	await expect(page.getByTestId('send-attempt')).toBeEnabled();
	await expect.poll(async () => (await sql<{ n: number }[]>`select count(*)::int as n from frame_uploads where user_id = ${enrolled.id}`)[0].n).toBe(0);
	expect(await attemptsNow()).toBe(before);
});

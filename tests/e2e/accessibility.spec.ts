// Every main page, as a visitor and as each role, on a desktop and (in the phone project) on a phone, through axe-core with the
// WCAG 2.0/2.1/2.2 A and AA rules: no serious or critical violation. What axe cannot see (keyboard journeys, flashing) is tested elsewhere.
import AxeBuilder from '@axe-core/playwright';
import { expect, test, type APIRequestContext, type Browser, type Page } from '@playwright/test';
import { randomUUID } from 'node:crypto';
import { existsSync, mkdirSync } from 'node:fs';
import { join } from 'node:path';
import postgres from 'postgres';
import { makeFrame, REFERENCE_EXIF } from '../../src/lib/server/analysis/test-frames';
import { enrolDemoLearner, framePair } from './support/enrolled-learner';
import {
	adminScreens,
	authorScreens,
	demoAccount,
	LESSON,
	learnerScreens,
	mentorScreens,
	signInWith,
	visitorScreens,
	type Role,
	type Screen
} from './support/screens';

const TAGS = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'];
const sql = postgres(process.env.DATABASE_URL ?? 'postgres://stopwise@127.0.0.1:54329/stopwise', { max: 2, onnotice: () => {} });
// signed-in sessions, one per role for the whole run (test-results is emptied at the start of each run)
const STATES = join('test-results', 'accessibility-sessions');

// generous: a walk of a dozen pages with axe on each, on two cores shared by several builds
test.describe.configure({ timeout: 240_000 });

/** Opens the page and (softly, so every page of a walk reports) fails with a readable list of every serious or critical violation. */
async function audit(page: Page, screen: Screen) {
	await page.goto(screen.path);
	if (screen.heading) await expect(page.getByRole('heading', { level: 1 })).toHaveText(screen.heading);
	const { violations } = await new AxeBuilder({ page }).withTags(TAGS).analyze();
	const grave = violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
	const report = grave
		.map((v) => `${v.id} (${v.impact}): ${v.help}\n${v.nodes.slice(0, 6).map((n) => `    ${n.target.join(' ')}  ${n.failureSummary?.split('\n').slice(1).join(' ') ?? ''}`).join('\n')}${v.nodes.length > 6 ? `\n    … and ${v.nodes.length - 6} more` : ''}`)
		.join('\n');
	expect.soft(grave.length, `${screen.path}: ${grave.length} serious or critical violations\n${report}`).toBe(0);
}

/** The saved session of a demo role, signing in once per run. */
async function sessionOf(browser: Browser, role: Role): Promise<string> {
	const file = join(STATES, `${role}.json`);
	if (existsSync(file)) return file;
	mkdirSync(STATES, { recursive: true });
	// storageState: undefined, or the describe's own (not yet written) session would be loaded
	const context = await browser.newContext({ baseURL: test.info().project.use.baseURL, storageState: undefined });
	const { email, password } = demoAccount(role);
	await signInWith(await context.newPage(), email, password);
	await context.storageState({ path: file });
	await context.close();
	return file;
}

/** Walks the screens in one page, one load each. */
async function walk(page: Page, screens: Screen[]) {
	for (const screen of screens) await test.step(screen.path, () => audit(page, screen));
}

// the demo learner, enrolled directly (payments are another feature), with two Attempts for the verdict and review pages:
// one that passes and one told "not yet" (no flash on the subject), so both verdicts' colours are checked
enrolDemoLearner();
let attemptHref = '';
let notYetHref = '';

async function sendPair(request: APIRequestContext, baseURL: string, flash: number, subjectLift: boolean): Promise<string> {
	const pair = await framePair({ width: 600, height: 400, flash });
	const lit = subjectLift
		? pair.lit
		: await makeFrame({ width: 600, height: 400, subject: { stops: -Math.log2(3) }, background: { stops: 0.5 - Math.log2(3) }, exif: { ...REFERENCE_EXIF, exposureTime: 1 / 1500, flash } });
	const answer = await request.post('/api/v1/attempts', {
		headers: { origin: new URL(baseURL).origin },
		multipart: {
			assignment: LESSON,
			submissionKey: randomUUID(),
			subjectBox: '0.3,0.25,0.4,0.5',
			lightPlan: '',
			'frame:reference': { name: 'reference.jpg', mimeType: 'image/jpeg', buffer: pair.reference },
			'frame:lit': { name: 'lit.jpg', mimeType: 'image/jpeg', buffer: lit }
		}
	});
	expect(answer.status()).toBe(201);
	return ((await answer.json()) as { href: string }).href;
}

test.beforeAll(async ({ browser }) => {
	const baseURL = test.info().project.use.baseURL!;
	const context = await browser.newContext({ storageState: await sessionOf(browser, 'learner'), baseURL });
	attemptHref = await sendPair(context.request, baseURL, 0x19, true);
	notYetHref = await sendPair(context.request, baseURL, 0x10, false);
	await context.close();
	// the walk reads the verdicts, so it waits for the grader
	const id = notYetHref.split('/').pop()!;
	await expect.poll(async () => (await sql<{ verdict: string | null }[]>`select verdict from attempts where id = ${id}`)[0]?.verdict, { timeout: 60_000 }).toBe('fail');
});

test.afterAll(() => sql.end());

test('every page a visitor sees', async ({ page }) => walk(page, visitorScreens));

for (const role of ['learner', 'mentor', 'author', 'admin'] as const) {
	test.describe(`as ${role === 'learner' || role === 'mentor' ? 'a' : 'an'} ${role}`, () => {
		test.use({ storageState: join(STATES, `${role}.json`) });
		test.beforeAll(async ({ browser }) => {
			await sessionOf(browser, role);
		});
		test(`every ${role} page`, async ({ page }) => {
			const screens = {
				learner: () => [...learnerScreens(attemptHref), { name: 'verdict-not-yet', path: notYetHref, heading: /^Off the axis$/ }],
				mentor: () => [
					...mentorScreens,
					{ name: 'mentor-attempt', path: attemptHref.replace('/attempts/', '/mentor/attempts/') },
					{ name: 'mentor-attempt-not-yet', path: notYetHref.replace('/attempts/', '/mentor/attempts/') }
				],
				author: () => authorScreens(sql),
				admin: () => adminScreens
			}[role];
			await walk(page, await screens());
		});
	});
}

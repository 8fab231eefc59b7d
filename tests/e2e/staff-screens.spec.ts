// Every main staff page (mentor, author, admin), on a desktop and on a 390 px phone, saved under test-results/staff-screens/ to be
// looked at; on the way, each page has its heading, no broken image, and on the phone nothing wider than the screen.
import { devices, expect, test, type Browser, type Page } from '@playwright/test';
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import postgres from 'postgres';
import { adminScreens, authorScreens, demoAccount, mentorScreens, signInWith, type Role, type Screen } from './support/screens';
const SHOTS = join('test-results', 'staff-screens');
const sql = postgres(process.env.DATABASE_URL ?? 'postgres://stopwise@127.0.0.1:54329/stopwise', { max: 2, onnotice: () => {} });
const { defaultBrowserType: _browser, ...pixel } = devices['Pixel 7'];
const phone = { ...pixel, viewport: { width: 390, height: 844 } };
const desktop = { viewport: { width: 1280, height: 900 } };

test.describe.configure({ mode: 'serial', timeout: 180_000 });
test.afterAll(async () => {
	await sql.end();
});

async function signIn(browser: Browser, role: Role, options: object): Promise<Page> {
	const page = await (await browser.newContext(options)).newPage();
	await signInWith(page, demoAccount(role).email, demoAccount(role).password);
	return page;
}

/** Opens a page, checks what every screen must hold, and saves it. */
async function look(page: Page, { path, heading, name }: Screen, onPhone: boolean) {
	await page.goto(path);
	if (heading) await expect(page.getByRole('heading', { level: 1 })).toHaveText(heading);
	const broken = await page.locator('img').evaluateAll((imgs) => imgs.filter((i) => (i as HTMLImageElement).complete && (i as HTMLImageElement).naturalWidth === 0).map((i) => (i as HTMLImageElement).src));
	expect(broken, `${path}: broken images`).toEqual([]);
	if (onPhone) {
		// tables may scroll inside their own box; the page itself must not
		const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
		expect(overflow, `${path}: wider than the phone by ${overflow} px`).toBeLessThanOrEqual(1);
	}
	mkdirSync(SHOTS, { recursive: true });
	await page.screenshot({ path: join(SHOTS, `${name}-${onPhone ? 'phone' : 'desktop'}.png`), fullPage: true });
}

for (const [label, options] of [
	['desktop', desktop],
	['phone', phone]
] as const) {
	const onPhone = label === 'phone';

	for (const role of ['mentor', 'author', 'admin'] as const) {
		test(`${role} pages on a ${label}`, async ({ browser }) => {
			const screens = role === 'mentor' ? mentorScreens : role === 'author' ? await authorScreens(sql) : adminScreens;
			const page = await signIn(browser, role, options);
			for (const screen of screens) await look(page, screen, onPhone);
			await page.context().close();
		});
	}
}

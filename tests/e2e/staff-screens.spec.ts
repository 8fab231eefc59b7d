// Every main staff page (mentor, author, admin), on a desktop and on a 390 px phone, saved under test-results/staff-screens/ to be
// looked at; on the way, each page has its heading, no broken image, and on the phone nothing wider than the screen.
import { devices, expect, test, type Browser, type Page } from '@playwright/test';
import { mkdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import postgres from 'postgres';

type Demo = { role: string; email: string; password: string };
const demo: Demo[] = JSON.parse(readFileSync('scripts/demo-accounts.json', 'utf8'));
const account = (role: string) => demo.find((d) => d.role === role)!;
const SHOTS = join('test-results', 'staff-screens');
const sql = postgres(process.env.DATABASE_URL ?? 'postgres://stopwise@127.0.0.1:54329/stopwise', { max: 2, onnotice: () => {} });
const { defaultBrowserType: _browser, ...pixel } = devices['Pixel 7'];
const phone = { ...pixel, viewport: { width: 390, height: 844 } };
const desktop = { viewport: { width: 1280, height: 900 } };

test.describe.configure({ mode: 'serial', timeout: 180_000 });
test.afterAll(async () => {
	await sql.end();
});

async function signIn(browser: Browser, role: string, options: object): Promise<Page> {
	const page = await (await browser.newContext(options)).newPage();
	await page.goto('/signin');
	await page.getByLabel('E-mail', { exact: true }).fill(account(role).email);
	await page.getByLabel('Password', { exact: true }).fill(account(role).password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).not.toHaveURL(/\/signin/);
	return page;
}

/** Opens a page, checks what every screen must hold, and saves it. */
async function look(page: Page, path: string, heading: RegExp, name: string, onPhone: boolean) {
	await page.goto(path);
	await expect(page.getByRole('heading', { level: 1 })).toHaveText(heading);
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

	test(`mentor pages on a ${label}`, async ({ browser }) => {
		const page = await signIn(browser, 'mentor', options);
		await look(page, '/mentor', /^Review queue$/, 'mentor-queue', onPhone);
		await look(page, '/mentor/plans', /^Shoot Plans waiting$/, 'mentor-plans', onPhone);
		await page.context().close();
	});

	test(`author pages on a ${label}`, async ({ browser }) => {
		const [lesson] = await sql<{ id: number; title: string }[]>`select id, title from lessons where slug = 'off-the-axis'`;
		const [assignment] = await sql<{ id: number }[]>`select id from assignments where slug = 'off-the-axis'`;
		const page = await signIn(browser, 'author', options);
		await look(page, '/author', /^Lessons$/, 'author-tree', onPhone);
		await look(page, `/author/lessons/${lesson.id}`, /^Edit lesson$/, 'author-lesson', onPhone);
		await look(page, `/author/lessons/${lesson.id}/history`, new RegExp(`^History of “${lesson.title}”$`), 'author-history', onPhone);
		await look(page, `/author/assignments/${assignment.id}`, /^Assignment$/, 'author-assignment', onPhone);
		await page.context().close();
	});

	test(`admin pages on a ${label}`, async ({ browser }) => {
		const page = await signIn(browser, 'admin', options);
		await look(page, '/admin/people', /^People$/, 'admin-people', onPhone);
		await look(page, '/admin/enrolments', /^Enrolments$/, 'admin-enrolments', onPhone);
		await look(page, '/admin/payments', /^Payments$/, 'admin-payments', onPhone);
		await look(page, '/admin/coupons', /^Coupons$/, 'admin-coupons', onPhone);
		await look(page, '/admin/audit', /^Audit log$/, 'admin-audit', onPhone);
		await look(page, '/admin/mailbox', /^Mailbox$/, 'admin-mailbox', onPhone);
		await page.context().close();
	});
}

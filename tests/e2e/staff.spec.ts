// Authors build a spec with the form and try it on two frames; admins see refunds and overrides in the audit log and download it.
import { expect, test, type Page } from '@playwright/test';
import { readFileSync } from 'node:fs';
import postgres from 'postgres';
import { signUpAndConfirm } from './support/sign-up';
import { makeFrame, REFERENCE_EXIF } from '../../src/lib/server/analysis/test-frames';

type Demo = { role: string; email: string; password: string };
const demo: Demo[] = JSON.parse(readFileSync('scripts/demo-accounts.json', 'utf8'));
const account = (role: string) => demo.find((d) => d.role === role)!;
const sql = postgres(process.env.DATABASE_URL ?? 'postgres://stopwise@127.0.0.1:54329/stopwise', { max: 2, onnotice: () => {} });
const stamp = Date.now().toString(36);
const lessonTitle = `Spec form trial ${stamp}`;

async function signInAs(page: Page, role: string, redirectTo: string) {
	const { email, password } = account(role);
	await page.goto(`/signin?redirectTo=${encodeURIComponent(redirectTo)}`);
	await page.getByLabel('E-mail', { exact: true }).fill(email);
	await page.getByLabel('Password', { exact: true }).fill(password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).toHaveURL(new RegExp(`${redirectTo.replace(/[/?]/g, '\\$&')}$`));
}

test.afterAll(async () => {
	await sql`delete from lessons where title = ${lessonTitle}`;
	await sql`delete from cohorts where slug = ${`e2e-cohort-${stamp}`}`;
	await sql`delete from users where id = ${`e2e-cohort-${stamp}`}`;
	await sql`delete from field_days where slug = ${`e2e-day-${stamp}`}`;
	await sql`delete from audit_log where subject like ${`%${stamp}%`}`;
	await sql.end();
});

test('an author builds a spec with the form, tries it on two frames, and saves it', async ({ page }) => {
	test.setTimeout(120_000);
	await signInAs(page, 'author', '/author');
	await page.getByTestId('author-module').filter({ hasText: 'Bringing your own light' }).getByRole('link', { name: 'New lesson' }).click();
	await page.getByLabel('Title').fill(lessonTitle);
	await page.getByRole('button', { name: 'Create lesson' }).click();
	await expect(page).toHaveURL(/\/author\/lessons\/\d+\?notice=created$/);
	const lessonPath = new URL(page.url()).pathname;
	await page.goto(`${lessonPath}/assignments/new`);

	await page.getByLabel('Slug').fill(`spec-form-${stamp}`);
	await page.getByLabel('Title').fill('Freeze the rower');
	await page.getByLabel('Brief').fill('A reference frame, then a lit frame at 1/1000 s or faster.');
	// the starting spec uses the same frame names as every shipped assignment
	const frames = page.getByTestId('spec-frames');
	await expect(frames.getByRole('textbox', { name: 'Frame 1 name' })).toHaveValue('reference');
	await expect(frames.getByRole('textbox', { name: 'Frame 2 name' })).toHaveValue('lit');

	// add a criterion from the list and fill its field in camera terms
	await page.getByTestId('add-kind').selectOption({ label: 'Shutter at least this fast' });
	await page.getByRole('button', { name: 'Add', exact: true }).click();
	const cards = page.getByTestId('criterion-card');
	await expect(cards).toHaveCount(3);
	const shutter = cards.nth(2);
	await expect(shutter).toContainText('Type it as on the camera');
	await shutter.getByTestId('field-seconds').fill('1/4000');
	await shutter.getByTestId('field-seconds').press('Tab');
	// an out-of-range value is named by the field, from the same checker the server uses
	await cards.nth(0).getByTestId('field-stops').fill('9');
	await cards.nth(0).getByTestId('field-stops').press('Tab');
	await expect(cards.nth(0)).toContainText('must be at most 6', { timeout: 10_000 });
	await cards.nth(0).getByTestId('field-stops').fill('1.5');
	await cards.nth(0).getByTestId('field-stops').press('Tab');
	await expect(page.getByTestId('spec-status')).toHaveText('The spec is valid.', { timeout: 10_000 });
	await shutter.getByTestId('field-seconds').fill('1/1000');
	await shutter.getByTestId('field-seconds').press('Tab');

	// the JSON view shows the same spec, and edits there come back to the form
	await page.getByRole('button', { name: 'JSON', exact: true }).click();
	const json = page.getByTestId('spec-json');
	const text = JSON.parse(await json.inputValue());
	expect(text.frames).toEqual(['reference', 'lit']);
	expect(text.criteria[2]).toEqual({ kind: 'shutter-min', seconds: 0.001 });
	await json.fill(JSON.stringify({ ...text, criteria: [...text.criteria.slice(0, 2), { kind: 'shutter-min', seconds: 0.002 }] }, null, 2));
	await page.getByRole('button', { name: 'Form', exact: true }).click();
	await expect(cards.nth(2).getByTestId('field-seconds')).toHaveValue('1/500');
	await cards.nth(2).getByTestId('field-seconds').fill('1/1000');
	await cards.nth(2).getByTestId('field-seconds').press('Tab');
	await expect(page.getByTestId('spec-criteria')).toContainText('1/1000', { timeout: 10_000 });

	// try it on two frames made here: reference 1/500 s, lit 1/1500 s (≈1.6 stops under), flash fired
	const reference = await makeFrame({ width: 900, height: 600, subject: { stops: 0 }, background: { stops: 0.5 }, exif: { ...REFERENCE_EXIF } });
	const lit = await makeFrame({ width: 900, height: 600, subject: { stops: 0 }, background: { stops: 0.5 - Math.log2(3) }, exif: { ...REFERENCE_EXIF, exposureTime: 1 / 1500, flash: 0x19 } });
	const trial = page.getByTestId('spec-trial');
	await trial.getByTestId('trial-frame-reference').setInputFiles({ name: 'reference.jpg', mimeType: 'image/jpeg', buffer: reference });
	await trial.getByTestId('trial-frame-lit').setInputFiles({ name: 'lit.jpg', mimeType: 'image/jpeg', buffer: lit });
	await trial.getByTestId('trial-run').click();
	const result = trial.getByTestId('trial-result');
	await expect(result.getByTestId('verdict-badge')).toHaveText('Passed', { timeout: 30_000 });
	await expect(result.getByTestId('criterion-verdict')).toHaveText(['Met', 'Met', 'Met']);
	await expect(result.getByTestId('criterion-shutter-min')).toContainText('1/1500 s');
	const before = await sql`select count(*)::int as n from attempts`;

	await page.getByRole('button', { name: 'Create assignment' }).click();
	await expect(page).toHaveURL(/\/author\/assignments\/\d+\?notice=created$/);
	const [saved] = await sql<{ spec: { criteria: { kind: string }[] } }[]>`select spec from assignments where slug = ${`spec-form-${stamp}`}`;
	expect(saved.spec.criteria.map((c) => c.kind)).toEqual(['ambient-under', 'subject-lift', 'shutter-min']);
	// trying stored nothing as an attempt
	expect(await sql`select count(*)::int as n from attempts`).toEqual(before);
});

test('a refund appears in the audit log with its reason; the log filters and downloads as CSV', async ({ page, browser }) => {
	test.setTimeout(90_000);
	// a fresh learner pays on the fake's payment page
	const email = `e2e-audit-${stamp}@test.example`;
	await signUpAndConfirm(page, `Audit Payer ${stamp}`, email, 'strobes in the rain');
	await expect(page.getByText(`${email} is verified`)).toBeVisible();
	await page.goto('/courses/daylight-flash-for-action');
	await page.getByRole('button', { name: 'Enrol — $149.00' }).click();
	await page.getByLabel('Card number').fill('4242 4242 4242 4242');
	await page.getByRole('button', { name: 'Pay $149.00' }).click();
	await expect(page.getByRole('heading', { name: "You're enrolled" })).toBeVisible();

	const context = await browser.newContext({ acceptDownloads: true });
	const admin = await context.newPage();
	await signInAs(admin, 'admin', `/admin/payments?q=${encodeURIComponent(email)}`);
	const row = admin.getByRole('row').filter({ hasText: email });
	await row.getByText('Refund…').click();
	await row.getByLabel('Why (kept in the audit log)').fill(`asked within a week ${stamp}`);
	await row.getByRole('button', { name: /Yes, refund/ }).click();
	await expect(admin.getByRole('status').filter({ hasText: 'Refunded' })).toBeVisible();

	await admin.goto('/admin/audit');
	await admin.getByLabel('Action').selectOption({ label: 'Payment refunded' });
	await admin.getByLabel('Search').fill(email);
	await admin.getByRole('button', { name: 'Filter' }).click();
	await expect(admin).toHaveURL(/action=payment\.refund/);
	const entry = admin.getByTestId('audit-row').filter({ hasText: email });
	await expect(entry).toHaveCount(1);
	await expect(entry).toContainText(`asked within a week ${stamp}`);
	await expect(entry).toContainText(account('admin').email);
	await expect(entry).toContainText('$149.00');

	const download = admin.waitForEvent('download');
	await admin.getByTestId('audit-csv').click();
	const file = await download;
	expect(file.suggestedFilename()).toMatch(/^stopwise-audit-\d{4}-\d{2}-\d{2}\.csv$/);
	const csv = readFileSync(await file.path(), 'utf8');
	const lines = csv.trim().split(/\r\n/);
	expect(lines[0]).toBe('when_utc,who,action,action_label,subject,what,why');
	expect(lines).toHaveLength(2);
	expect(lines[1]).toContain('payment.refund');
	expect(lines[1]).toContain(`asked within a week ${stamp}`);
	await context.close();
});

test('an author runs a cohort with the forms: a member who has not paid yet, a due date set and taken away', async ({ page }) => {
	await signInAs(page, 'author', '/author/cohorts');
	await page.getByLabel('Name').fill(`E2E cohort ${stamp}`);
	await page.getByLabel('Address part').fill(`e2e-cohort-${stamp}`);
	await page.getByLabel('Start date').fill('2027-10-01');
	await page.getByRole('button', { name: 'Make the cohort' }).click();
	await expect(page.getByRole('heading', { level: 1, name: `E2E cohort ${stamp}` })).toBeVisible();

	// a learner who has not paid for the course
	const email = `e2e-cohort-${stamp}@test.example`;
	await sql`insert into users (id, email, name, email_verified) values (${`e2e-cohort-${stamp}`}, ${email}, 'Cohort Tester (test)', true)`;
	await page.getByLabel('Learner’s e-mail').fill(email);
	await page.getByRole('button', { name: 'Add to the cohort' }).click();
	await expect(page.getByText(/joined E2E cohort .* not enrolled in the course yet/)).toBeVisible();
	await expect(page.getByTestId('member-not-enrolled')).toBeVisible();

	await page.getByLabel('Assignment').selectOption({ index: 0 });
	const title = (await page.getByLabel('Assignment').locator('option').first().textContent())!.trim();
	await page.getByLabel('Due (UTC)').fill('2027-10-20T18:00');
	await page.getByRole('button', { name: 'Set the due date' }).click();
	await expect(page.getByText(`${title} is now due 2027-10-20 18:00 UTC.`)).toBeVisible();
	await page.getByRole('button', { name: `Remove the due date of ${title}` }).click();
	await expect(page.getByText(`${title} has no due date any more.`)).toBeVisible();
	await expect(page.getByRole('button', { name: `Remove the due date of ${title}` })).toHaveCount(0);
});

test('an author calls off a field day with a reason, which the day’s page then shows', async ({ page }) => {
	const slug = `e2e-day-${stamp}`;
	const start = new Date(Date.now() + 20 * 86_400_000);
	const [day] = await sql<{ id: number }[]>`
		insert into field_days (slug, course_id, title, starts_at, ends_at, time_zone, meeting_point, seats, safety_briefing)
		select ${slug}, id, ${`E2E rowing morning ${stamp}`}, ${start}, ${new Date(start.getTime() + 3 * 3_600_000)}, 'America/New_York', 'Boathouse slipway (test)', 4,
			'Stands stay behind the marked line, bagged; no flash toward a crew in the last 20 metres; the venue marshal decides.'
		from courses where slug = 'daylight-flash-for-action' returning id`;
	await signInAs(page, 'author', `/author/field-days/${day.id}`);
	await page.getByRole('link', { name: /Call off this field day/ }).click();
	await expect(page.getByTestId('call-off-summary')).toContainText('Nobody has booked yet.');
	await page.getByRole('button', { name: 'Call off the field day' }).click();
	await expect(page.getByText('Tick the box to confirm: this cannot be undone.')).toBeVisible();
	await page.getByLabel(/^Why/).fill('The river is in flood and the club has closed the slipway (test).');
	await page.getByRole('checkbox').check();
	await page.getByRole('button', { name: 'Call off the field day' }).click();
	await expect(page).toHaveURL(/\/author\/field-days\?notice=called-off/);
	await expect(page.getByText('Field day called off; nobody had a place to cancel.')).toBeVisible();
	await page.goto(`/field-days/${slug}`);
	await expect(page.getByTestId('called-off')).toContainText('The river is in flood');
});

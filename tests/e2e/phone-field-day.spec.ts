// A field day on a phone, end to end: one person books and pays the only seat; the demo learner joins the waiting
// list, is offered the seat by e-mail when the first cancels, pays, gets the calendar invitation in the mail fake,
// is on the mentor's roll call, and uploads the day's frames with one tap through the normal attempt path.
import { expect, test, type Browser, type Page } from '@playwright/test';
import { readFile, rm } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import { readFileSync } from 'node:fs';
import { simpleParser } from 'mailparser';
import postgres from 'postgres';
import { makeFrame, REFERENCE_EXIF } from '../../src/lib/server/analysis/test-frames';
import { linkInMailTo } from './support/sign-up';

type Demo = { role: string; email: string; password: string };
const demo: Demo[] = JSON.parse(readFileSync('scripts/demo-accounts.json', 'utf8'));
const account = (role: string) => demo.find((d) => d.role === role)!;
const learner = account('learner');
const first = account('author');
const mentor = account('mentor');

const COURSE = 'daylight-flash-for-action';
const ASSIGNMENT = 'off-the-axis';
const slug = `e2e-rowing-${Date.now()}`;
const title = `Rowing at the boathouse (e2e ${Date.now() % 100000})`;
const mailboxDir = resolve(process.env.MAILBOX_DIR ?? join('.data', 'mailbox'));
const sql = postgres(process.env.DATABASE_URL ?? 'postgres://stopwise@127.0.0.1:54329/stopwise', { max: 2, onnotice: () => {} });
const startedAt = new Date();
let learnerId = '';
let courseId = 0;

test.beforeAll(async () => {
	[{ id: learnerId }] = await sql<{ id: string }[]>`select id from users where email = ${learner.email}`;
	[{ id: courseId }] = await sql<{ id: number }[]>`select id from courses where slug = ${COURSE}`;
	const [{ id: mentorId }] = await sql<{ id: string }[]>`select id from users where email = ${mentor.email}`;
	const [{ id: assignmentId }] = await sql<{ id: number }[]>`select id from assignments where slug = ${ASSIGNMENT}`;
	// the upload goes through the normal attempt path, which needs the course
	await sql`insert into enrolments (user_id, course_id, source) values (${learnerId}, ${courseId}, 'admin') on conflict do nothing`;
	// one paid seat, starting in three hours: bookable now, and "on the day" already
	const startsAt = new Date(Date.now() + 3 * 3_600_000);
	await sql`insert into field_days (slug, course_id, assignment_id, title, starts_at, ends_at, time_zone, meeting_point, seats, price_cents, refund_hours, kit_list, safety_briefing, mentor_ids)
		values (${slug}, ${courseId}, ${assignmentId}, ${title}, ${startsAt}, ${new Date(startsAt.getTime() + 3 * 3_600_000)}, 'America/New_York',
		'Boathouse slipway (invented venue)', 1, 3000, 1, 'Strobe, stand, two sandbags',
		'Stands stay off the slipway and are sandbagged, more in wind. Battery strobes only in rain. Never flash into a rower''s eyes. Venue rules and local codes come first.',
		${[mentorId]})`;
});

test.afterAll(async () => {
	await sql`delete from field_days where slug = ${slug}`;
	const rows = await sql<{ id: string }[]>`delete from attempts where user_id = ${learnerId} and created_at >= ${startedAt} returning id`;
	const dir = process.env.STOPWISE_DATA_DIR ?? join('.data', 'files');
	await Promise.all(rows.map((r) => rm(join(dir, 'attempts', r.id), { recursive: true, force: true })));
	await sql`delete from enrolments where user_id = ${learnerId} and course_id = ${courseId} and source = 'admin'`;
	await sql.end();
});

async function signedIn(browser: Browser, who: Demo, path: string): Promise<Page> {
	const context = await browser.newContext({ ...test.info().project.use });
	const page = await context.newPage();
	await page.goto(`/signin?redirectTo=${encodeURIComponent(path)}`);
	await page.getByLabel('E-mail', { exact: true }).fill(who.email);
	await page.getByLabel('Password', { exact: true }).fill(who.password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).toHaveURL(new RegExp(path.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')));
	return page;
}

async function payOnTheFakesPage(page: Page) {
	await expect(page).toHaveURL(/\/pay\/cs_test_/);
	await page.getByLabel('Card number').fill('4242 4242 4242 4242');
	await page.getByRole('button', { name: 'Pay $30.00' }).click();
	await expect(page).toHaveURL(new RegExp(`/field-days/${slug}\\?paid=cs_test_`));
	await expect(page.getByText('Paid: your seat is booked.')).toBeVisible();
}

/** The calendar part of the newest mail to `to` matching `subject`, parsed from the raw message the fake kept. */
async function invitationTo(to: string, subject: RegExp): Promise<string> {
	let ics = '';
	await expect
		.poll(
			async () => {
				const index: { id: string; to: string[]; subject: string }[] = JSON.parse(await readFile(join(mailboxDir, 'index.json'), 'utf8').catch(() => '[]'));
				const hit = index.filter((m) => m.to.includes(to.toLowerCase()) && subject.test(m.subject) && m.subject.includes(title)).at(-1);
				if (!hit) return '';
				const parsed = await simpleParser(await readFile(join(mailboxDir, `${hit.id}.eml`)));
				ics = parsed.attachments.find((a) => a.contentType.startsWith('text/calendar'))?.content.toString('utf8') ?? '';
				return ics;
			},
			{ message: `an invitation to ${to}` }
		)
		.toContain('BEGIN:VCALENDAR');
	return ics.replace(/\r?\n[ \t]/g, '');
}

test('book a paid seat, wait, be moved up when someone cancels, get the invitation, be on the roll call, upload from the phone', async ({ browser }) => {
	test.setTimeout(240_000);
	const dayPath = `/field-days/${slug}`;

	// someone else books and pays the only seat; their invitation arrives
	const other = await signedIn(browser, first, dayPath);
	await expect(other.getByTestId('safety-briefing')).toContainText('Never flash into a rower');
	await expect(other.getByTestId('refund-rule')).toContainText('full refund');
	await other.getByLabel(/I have read the safety briefing/).check();
	await other.getByRole('button', { name: 'Book and pay $30.00' }).click();
	await payOnTheFakesPage(other);
	expect(await invitationTo(first.email, /^Your seat/)).toContain('METHOD:REQUEST');

	// the day is full: the learner joins the waiting list
	const phone = await signedIn(browser, learner, dayPath);
	await expect(phone.getByTestId('seats-left')).toHaveText('0');
	await phone.getByLabel(/I have read the safety briefing/).check();
	await phone.getByRole('button', { name: 'Join the waiting list' }).click();
	await expect(phone.getByText('you are number 1 on the waiting list')).toBeVisible();

	// the first person cancels (before the refund deadline: refunded); the learner is offered the seat by e-mail
	await other.getByRole('button', { name: 'Cancel my seat' }).click();
	await expect(other.getByText('Cancelled. $30.00 is refunded.')).toBeVisible();
	const offer = await linkInMailTo(learner.email, new RegExp(`^A seat is free: ${title.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}`));
	await phone.goto(new URL(offer).pathname);
	await expect(phone.getByTestId('booking-status')).toContainText('A seat has come free');
	await phone.getByLabel(/I have read the safety briefing/).check();
	await phone.getByRole('button', { name: 'Take the seat and pay $30.00' }).click();
	await payOnTheFakesPage(phone);
	const ics = await invitationTo(learner.email, /^Your seat/);
	expect(ics).toContain('METHOD:REQUEST');
	expect(ics).toMatch(/UID:field-day-booking-\d+@stopwise/);

	// on the day: the briefing heard, then the mentor on duty marks the learner here
	await phone.getByRole('button', { name: 'I heard today’s safety briefing' }).click();
	await expect(phone.getByTestId('briefing-on-day')).toBeVisible();
	const roll = await signedIn(browser, mentor, `/mentor/field-days/${slug}`);
	const row = roll.getByTestId('participant').filter({ hasText: 'Robin Okafor' });
	await expect(row).toContainText('heard today');
	await row.getByRole('button', { name: /^Mark .* here$/ }).click();
	await expect(row).toContainText('here');
	await expect(roll.getByTestId('came-count')).toHaveText('1');

	// one tap to the day's Assignment, and the frames go up through the normal attempt path
	await phone.getByTestId('upload-frames').click();
	await expect(phone.getByRole('heading', { level: 1 })).toHaveText('Off the axis');
	const reference = await makeFrame({ width: 900, height: 600, subject: { stops: 0 }, background: { stops: 0.5 }, exif: { ...REFERENCE_EXIF } });
	const lit = await makeFrame({ width: 900, height: 600, subject: { stops: 0 }, background: { stops: 0.5 - Math.log2(3) }, exif: { ...REFERENCE_EXIF, exposureTime: 1 / 1500, flash: 0x19 } });
	await phone.getByTestId('frame-input-reference').setInputFiles({ name: 'reference.jpg', mimeType: 'image/jpeg', buffer: reference });
	await phone.getByTestId('frame-input-lit').setInputFiles({ name: 'lit.jpg', mimeType: 'image/jpeg', buffer: lit });
	await phone.getByTestId('send-attempt').click();
	await expect(phone).toHaveURL(/\/attempts\/[0-9a-f-]{36}$/, { timeout: 120_000 });
	const [made] = await sql<{ n: number }[]>`select count(*)::int as n from attempts where user_id = ${learnerId} and created_at >= ${startedAt}`;
	expect(made.n).toBe(1);
});

// The main pages of each role, shared by the screenshot walks and the accessibility check, and the demo sign-in.
import { expect, type Page } from '@playwright/test';
import { readFileSync } from 'node:fs';
import type { Sql } from 'postgres';

export const COURSE = 'daylight-flash-for-action';
export const LESSON = 'off-the-axis';

export type Role = 'learner' | 'mentor' | 'author' | 'admin';
type Demo = { role: Role; email: string; password: string };
const demo: Demo[] = JSON.parse(readFileSync('scripts/demo-accounts.json', 'utf8'));
export const demoAccount = (role: Role) => demo.find((d) => d.role === role)!;

/** A page to visit: a short name (for screenshots), its path and the text of its one h1 (none checked when absent). */
export type Screen = { name: string; path: string; heading?: RegExp };

/** Signs in on /signin and waits to leave it. */
export async function signInWith(page: Page, email: string, password: string): Promise<void> {
	await page.goto('/signin');
	await page.getByLabel('E-mail', { exact: true }).fill(email);
	await page.getByLabel('Password', { exact: true }).fill(password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).not.toHaveURL(/\/signin/);
}

export const visitorScreens: Screen[] = [
	{ name: 'home', path: '/' },
	{ name: 'catalogue', path: '/courses', heading: /^Courses$/ },
	{ name: 'course', path: `/courses/${COURSE}`, heading: /^Daylight Flash for Action$/ },
	{ name: 'sign-in-with-reason', path: `/courses/${COURSE}/inverse-square` },
	{ name: 'sign-in', path: '/signin' },
	{ name: 'sign-up', path: '/signup' },
	{ name: 'reset', path: '/reset' },
	{ name: 'sign-up-sent', path: '/signup/sent' },
	{ name: 'verify-without-link', path: '/verify' },
	{ name: 'instructor', path: '/instructors/jun-halvorsen' },
	{ name: 'verify-credential', path: '/verify/credential', heading: /^Check a certificate$/ }
];

/** The learner's pages; `attemptHref` adds the verdict page of one of their Attempts. */
export function learnerScreens(attemptHref?: string): Screen[] {
	return [
		{ name: 'catalogue', path: '/courses', heading: /^Courses$/ },
		{ name: 'course', path: `/courses/${COURSE}`, heading: /^Daylight Flash for Action$/ },
		{ name: 'lesson', path: `/courses/${COURSE}/what-a-stop-is`, heading: /^What a stop is$/ },
		{ name: 'lesson-with-assignment', path: `/courses/${COURSE}/${LESSON}`, heading: /^Off the camera axis$/ },
		{ name: 'lesson-with-clip', path: `/courses/${COURSE}/metering-and-going-under`, heading: /^Metering, then going under$/ },
		{ name: 'upload', path: `/courses/${COURSE}/${LESSON}/assignments/${LESSON}`, heading: /^Off the axis$/ },
		...(attemptHref ? [{ name: 'verdict', path: attemptHref, heading: /^Off the axis$/ }] : []),
		{ name: 'progress', path: '/progress', heading: /^Your progress$/ },
		{ name: 'account', path: '/account' },
		{ name: 'billing', path: '/account/billing' },
		{ name: 'field-days', path: '/field-days', heading: /^Field days$/ },
		{ name: 'cohort', path: '/cohort', heading: /^Your cohort$/ },
		{ name: 'field-day', path: '/field-days/trail-running-first-light', heading: /^Trail running at first light \(demo\)$/ }
	];
}

export const mentorScreens: Screen[] = [
	{ name: 'mentor-queue', path: '/mentor', heading: /^Review queue$/ },
	{ name: 'mentor-plans', path: '/mentor/plans', heading: /^Shoot Plans waiting$/ },
	{ name: 'mentor-field-days', path: '/mentor/field-days', heading: /^Field days on duty$/ },
	{ name: 'mentor-roll-call', path: '/mentor/field-days/trail-running-first-light', heading: /^Roll call$/ }
];

/** The author's pages for the demo lesson "Off the axis" (ids looked up in the database). */
export async function authorScreens(sql: Sql): Promise<Screen[]> {
	const [lesson] = await sql<{ id: number; title: string }[]>`select id, title from lessons where slug = ${LESSON}`;
	const [assignment] = await sql<{ id: number }[]>`select id from assignments where slug = ${LESSON}`;
	const [withClip] = await sql<{ id: number }[]>`select id from lessons where slug = 'metering-and-going-under'`;
	const [fieldDay] = await sql<{ id: number }[]>`select id from field_days where slug = 'bmx-flatland-afternoon'`;
	const [cohort] = await sql<{ id: number }[]>`select id from cohorts where slug = 'spring-evenings-2027'`;
	const escaped = lesson.title.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
	return [
		{ name: 'author-tree', path: '/author', heading: /^Lessons$/ },
		{ name: 'author-lesson', path: `/author/lessons/${lesson.id}`, heading: /^Edit lesson$/ },
		{ name: 'author-lesson-with-clip', path: `/author/lessons/${withClip.id}`, heading: /^Edit lesson$/ },
		{ name: 'author-history', path: `/author/lessons/${lesson.id}/history`, heading: new RegExp(`^History of “${escaped}”$`) },
		{ name: 'author-assignment', path: `/author/assignments/${assignment.id}`, heading: /^Assignment$/ },
		{ name: 'author-new-lesson', path: '/author/lessons/new' },
		{ name: 'author-new-assignment', path: `/author/lessons/${lesson.id}/assignments/new` },
		{ name: 'author-certificates', path: '/author/certificates', heading: /^Certificate rules$/ },
		{ name: 'author-field-days', path: '/author/field-days', heading: /^Field days$/ },
		{ name: 'author-new-field-day', path: '/author/field-days/new', heading: /^Schedule a field day$/ },
		{ name: 'author-field-day', path: `/author/field-days/${fieldDay.id}`, heading: /^BMX flatland afternoon \(demo\)$/ },
		{ name: 'author-field-day-call-off', path: `/author/field-days/${fieldDay.id}/call-off`, heading: /^Call off BMX flatland afternoon \(demo\)$/ },
		{ name: 'author-cohort', path: `/author/cohorts/${cohort.id}`, heading: /^Spring evenings 2027 \(demo\)$/ }
	];
}

export const adminScreens: Screen[] = [
	{ name: 'admin-people', path: '/admin/people', heading: /^People$/ },
	{ name: 'admin-enrolments', path: '/admin/enrolments', heading: /^Enrolments$/ },
	{ name: 'admin-payments', path: '/admin/payments', heading: /^Payments$/ },
	{ name: 'admin-coupons', path: '/admin/coupons', heading: /^Coupons$/ },
	{ name: 'admin-audit', path: '/admin/audit', heading: /^Audit log$/ },
	{ name: 'admin-mailbox', path: '/admin/mailbox', heading: /^Mailbox$/ },
	{ name: 'admin-learning-records', path: '/admin/learning-records', heading: /^Learning records$/ },
	{ name: 'admin-credentials', path: '/admin/credentials', heading: /^Certificates$/ },
	{ name: 'admin-coupon', path: '/admin/coupons/HARBOR20' },
	{ name: 'admin-cohorts', path: '/author/cohorts', heading: /^Cohorts$/ }
];

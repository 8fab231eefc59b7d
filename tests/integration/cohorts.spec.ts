// Cohorts on the real database: the review queue filtered by cohort (with what was sent late and who has sent nothing
// past a due date), the learner's cohort schedule, and the reminder e-mails before due dates (sent once).
import { randomBytes, randomUUID } from 'node:crypto';
import { eq, inArray } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { db } from '$lib/server/db';
import { assignments, attempts, cohortDueDates, cohortMembers, cohorts, courses, users } from '$lib/server/db/schema';
import { learnerCohorts } from '$lib/server/cohorts/schedule';
import { sendDueReminders } from '$lib/server/cohorts/reminders';
import { learnerFeed } from '$lib/server/field-days/calendar';
import { cohortReportCsv } from '$lib/server/field-days/report';
import { parse } from 'csv-parse/sync';
import { GET } from '../../src/routes/api/v1/review-queue/+server';
import * as schedulePage from '../../src/routes/(learn)/cohort/+page.server';
import { makeEvent, origin, throughHooks } from './support/request-event';
import { demoAccount, signedInCookies } from './support/people';
import { waitForMail } from './support/mail';

const slug = `test-cohort-${randomBytes(4).toString('hex')}`;
const people: { id: string; email: string; name: string }[] = [];
const attemptIds: string[] = [];
let cohortId = 0;
const DAY = 86_400_000;

beforeAll(async () => {
	const course = (await db.query.courses.findFirst({ where: eq(courses.slug, 'daylight-flash-for-action') }))!;
	for (const name of ['Ada Cohortson (test)', 'Bo Latecomer (test)', 'Cy Outsider (test)']) {
		const person = { id: randomBytes(15).toString('base64url'), email: `co-${randomBytes(5).toString('hex')}@test.example`, name };
		people.push(person);
	}
	await db.insert(users).values(people.map((p) => ({ ...p, emailVerified: true })));
	[{ id: cohortId }] = await db.insert(cohorts).values({ slug, title: 'Test cohort (test)', courseId: course.id, startsAt: new Date(Date.now() - 30 * DAY) }).returning({ id: cohorts.id });
	// the first two are members; the third sends an attempt too but is not in the cohort
	await db.insert(cohortMembers).values(people.slice(0, 2).map((p) => ({ cohortId, userId: p.id })));
	const found = await db.select({ id: assignments.id, slug: assignments.slug }).from(assignments).where(inArray(assignments.slug, ['off-the-axis', 'dim-the-sky']));
	const id = (s: string) => found.find((f) => f.slug === s)!.id;
	await db.insert(cohortDueDates).values([
		{ cohortId, assignmentId: id('off-the-axis'), dueAt: new Date(Date.now() - 2 * DAY) },
		{ cohortId, assignmentId: id('dim-the-sky'), dueAt: new Date(Date.now() + DAY) }
	]);
	const attempt = (userId: string, assignment: string, daysAgo: number) => {
		const attemptId = randomUUID();
		attemptIds.push(attemptId);
		return { id: attemptId, userId, assignmentId: id(assignment), submissionKey: `cohort-${attemptId}`, status: 'graded' as const, verdict: 'pass' as const, autoVerdict: 'pass' as const, spec: { frames: [], criteria: [] }, subjectBox: { x: 0.3, y: 0.2, w: 0.4, h: 0.6 }, createdAt: new Date(Date.now() - daysAgo * DAY) };
	};
	await db.insert(attempts).values([
		attempt(people[0].id, 'off-the-axis', 3), // on time
		attempt(people[1].id, 'dim-the-sky', 0.5), // the other learner: nothing for off-the-axis, which is overdue
		attempt(people[2].id, 'off-the-axis', 1) // not a member
	]);
	// a late one: the first learner again, after the due date
	await db.insert(attempts).values(attempt(people[0].id, 'off-the-axis', 1));
});

afterAll(async () => {
	await db.delete(attempts).where(inArray(attempts.id, attemptIds));
	await db.delete(cohorts).where(eq(cohorts.id, cohortId));
	await db.delete(users).where(inArray(users.id, people.map((p) => p.id)));
});

async function queue(query: string) {
	const cookies = await signedInCookies(demoAccount('mentor').email);
	const outcome = await throughHooks(makeEvent({ path: `/api/v1/review-queue${query}`, cookies }), (e) => GET(e as never));
	const response = (outcome as { value: Response }).value;
	return { status: response.status, body: await response.json() };
}

describe('the review queue by cohort', () => {
	test('only the cohort’s members, late attempts marked, and who has sent nothing past a due date', async () => {
		const { status, body } = await queue(`?cohort=${slug}&status=all&limit=100`);
		expect(status).toBe(200);
		expect(body.query.cohort).toBe(slug);
		const mine = body.attempts.filter((a: { id: string }) => attemptIds.includes(a.id));
		expect(mine.map((a: { learner: string }) => a.learner).sort()).toEqual(['Ada Cohortson (test)', 'Ada Cohortson (test)', 'Bo Latecomer (test)']);
		expect(body.attempts.every((a: { learner: string }) => a.learner !== 'Cy Outsider (test)')).toBe(true);
		expect(mine.filter((a: { late: boolean }) => a.late)).toHaveLength(1);
		expect(body.overdue).toEqual([{ learner: 'Bo Latecomer (test)', assignment: 'Off the axis', dueAt: expect.any(String) }]);

		const everyone = await queue('?status=all&limit=100');
		expect(everyone.body.attempts.some((a: { learner: string }) => a.learner === 'Cy Outsider (test)')).toBe(true);
		expect(everyone.body.overdue).toEqual([]);
	});
});

describe('the cohort report', () => {
	test('one row per member and due date: on time, late, missing or not yet due, as CSV', async () => {
		const rows = parse((await cohortReportCsv(slug))!, { columns: true }) as Record<string, string>[];
		const states = rows.map((r) => `${r.learner} · ${r.assignment} · ${r.state} · ${r.attempts}`);
		expect(states).toEqual([
			'Ada Cohortson (test) · Off the axis · on time · 2',
			'Ada Cohortson (test) · Dim the sky · not yet due · 0',
			'Bo Latecomer (test) · Off the axis · missing · 0',
			'Bo Latecomer (test) · Dim the sky · on time · 1'
		]);
		expect(rows[0]).toMatchObject({ verdict: 'pass', hours_to_critique: '' });
	});
});

describe('the learner’s cohort schedule and reminders', () => {
	test('each due date with its state: sent, due or overdue', async () => {
		const [ada] = await learnerCohorts(people[0].id);
		expect(ada.items.map((i) => [i.assignment, i.state])).toEqual([
			['Off the axis', 'submitted'],
			['Dim the sky', 'due']
		]);
		const [bo] = await learnerCohorts(people[1].id);
		expect(bo.items.map((i) => i.state)).toEqual(['overdue', 'submitted']);
		expect(await learnerCohorts(people[2].id)).toEqual([]);
		// the private calendar feed carries the due dates too
		const feed = await learnerFeed(people[0].id, origin);
		expect(feed).toContain(`UID:cohort-${cohortId}-due-`);
		expect(feed).toContain('SUMMARY:Due: Dim the sky');

		const cookies = await signedInCookies(demoAccount('learner').email);
		const page = await throughHooks(makeEvent({ path: '/cohort', cookies }), (e) => schedulePage.load(e as never));
		expect(page.kind).toBe('value');
	});

	test('a reminder goes to each member without an Attempt for a due date within 48 hours, once', async () => {
		const sentBefore = await sendDueReminders(origin);
		// Ada has nothing for "Dim the sky" (due tomorrow); Bo has sent it
		expect(sentBefore).toBeGreaterThanOrEqual(1);
		const mail = await waitForMail(people[0].email, /^Due soon: Dim the sky/);
		expect(mail.text).toContain('/assignments/dim-the-sky');
		await expect(waitForMail(people[1].email, /^Due soon/, 1500)).rejects.toThrow();
		expect(await sendDueReminders(origin)).toBe(0);
	});
});

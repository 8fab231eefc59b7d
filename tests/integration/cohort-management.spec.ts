// Managing cohorts on the real database: making one, members added and removed by e-mail (unknown address,
// non-learner, twice), due dates set and moved (a moved date lets the reminder go out again), each change audited
// once; and the field-day page offering the upload link only to those who may upload.
import { randomBytes } from 'node:crypto';
import { and, eq, inArray, like } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { db } from '$lib/server/db';
import { assignments, auditLog, cohortDueDates, cohorts, courses, enrolments, users } from '$lib/server/db/schema';
import { addMember, clearDueDate, cohortDetail, createCohort, removeMember, setDueDate } from '$lib/server/cohorts/manage';
import { sendDueReminders } from '$lib/server/cohorts/reminders';
import { fieldDayPage } from '$lib/server/field-days/read';
import { cohortSchema, dueDateSchema, memberSchema } from '$lib/forms/cohorts';
import { demoAccount } from './support/people';
import { origin } from './support/request-event';

const tag = randomBytes(4).toString('hex');
const slug = `managed-${tag}`;
const people = {
	learner: { id: randomBytes(15).toString('base64url'), email: `cm-l-${tag}@test.example`, name: 'Lou Member (test)', roles: ['learner' as const] },
	authorOnly: { id: randomBytes(15).toString('base64url'), email: `cm-a-${tag}@test.example`, name: 'Ari Writer (test)', roles: ['author' as const] }
};
let actor: { id: string; email: string };
let cohortId = 0;

const auditLines = () => db.select().from(auditLog).where(like(auditLog.href, `/author/cohorts/${cohortId}%`));

beforeAll(async () => {
	const admin = (await db.query.users.findFirst({ where: eq(users.email, demoAccount('admin').email) }))!;
	actor = { id: admin.id, email: admin.email };
	await db.insert(users).values(Object.values(people).map((p) => ({ ...p, emailVerified: true })));
});

afterAll(async () => {
	await db.delete(auditLog).where(like(auditLog.href, `/author/cohorts/${cohortId}%`));
	await db.delete(cohorts).where(like(cohorts.slug, `managed-${tag}%`));
	await db.delete(users).where(inArray(users.id, Object.values(people).map((p) => p.id)));
});

describe('the cohort forms', () => {
	test('refuse bad input with a message by field', () => {
		const bad = cohortSchema.safeParse({ title: 'x', slug: 'Not A Slug', courseSlug: '', startsOn: '2027-02-31x' });
		expect(bad.success).toBe(false);
		const fields = new Set(bad.error!.issues.map((i) => i.path[0]));
		expect(fields).toEqual(new Set(['title', 'slug', 'courseSlug', 'startsOn']));
		expect(memberSchema.safeParse({ email: 'not-an-address' }).success).toBe(false);
		expect(dueDateSchema.safeParse({ assignmentId: 1, dueAt: '2027-03-14' }).success).toBe(false);
		expect(dueDateSchema.parse({ assignmentId: 1, dueAt: '2027-03-14T23:00' })).toEqual({ assignmentId: 1, dueAt: '2027-03-14T23:00' });
	});
});

describe('making a cohort', () => {
	test('stores it with its mentor and one audit line; the same address again is refused on the slug', async () => {
		const made = await createCohort(actor, { title: 'Managed cohort (test)', slug, courseSlug: 'daylight-flash-for-action', mentorEmail: demoAccount('mentor').email, startsOn: '2027-09-01' });
		expect(made.ok).toBe(true);
		cohortId = made.ok ? made.id : 0;
		const row = (await db.query.cohorts.findFirst({ where: eq(cohorts.id, cohortId) }))!;
		expect(row.startsAt.toISOString()).toBe('2027-09-01T00:00:00.000Z');
		expect(row.mentorId).not.toBeNull();
		expect((await auditLines()).map((l) => l.action)).toEqual(['cohort.create']);

		const again = await createCohort(actor, { title: 'Another (test)', slug, courseSlug: 'daylight-flash-for-action', mentorEmail: '', startsOn: '2027-09-01' });
		expect(again).toEqual({ ok: false, field: 'slug', message: 'Another cohort already has this address.' });
		expect(await auditLines()).toHaveLength(1);
	});

	test('an unknown course or a mentor who is not one is told by field, and nothing is stored', async () => {
		expect(await createCohort(actor, { title: 'Nope (test)', slug: `${slug}-x`, courseSlug: 'no-such-course', mentorEmail: '', startsOn: '2027-09-01' })).toMatchObject({ ok: false, field: 'courseSlug' });
		expect(await createCohort(actor, { title: 'Nope (test)', slug: `${slug}-y`, courseSlug: 'daylight-flash-for-action', mentorEmail: people.learner.email, startsOn: '2027-09-01' })).toMatchObject({ ok: false, field: 'mentorEmail' });
		expect(await db.select().from(cohorts).where(inArray(cohorts.slug, [`${slug}-x`, `${slug}-y`]))).toEqual([]);
	});
});

describe('members by e-mail', () => {
	test('an unknown address and a person who is not a learner get a plain message', async () => {
		const unknown = await addMember(actor, cohortId, `nobody-${tag}@test.example`);
		expect(unknown).toEqual({ ok: false, message: `No account uses nobody-${tag}@test.example. Ask them to sign up first, then add them.` });
		const notLearner = await addMember(actor, cohortId, people.authorOnly.email);
		expect(notLearner).toEqual({ ok: false, message: `${people.authorOnly.email} is not a learner here, so cannot join a cohort.` });
		expect((await cohortDetail(cohortId))!.members).toEqual([]);
	});

	test('adding twice is harmless (one member, one audit line); removing twice likewise', async () => {
		const added = await addMember(actor, cohortId, people.learner.email.toUpperCase());
		expect(added).toMatchObject({ ok: true, changed: true });
		// allowed before paying, but the author is told, and the member list shows it
		expect(added.ok && added.message).toContain('not enrolled in the course yet');
		expect((await cohortDetail(cohortId))!.members).toMatchObject([{ email: people.learner.email, enrolled: false }]);
		expect(await addMember(actor, cohortId, people.learner.email)).toMatchObject({ ok: true, changed: false, message: `${people.learner.name} is already in Managed cohort (test).` });
		expect((await cohortDetail(cohortId))!.members.map((m) => m.email)).toEqual([people.learner.email]);

		expect(await removeMember(actor, cohortId, people.learner.email)).toMatchObject({ ok: true, changed: true });
		expect(await removeMember(actor, cohortId, people.learner.email)).toMatchObject({ ok: true, changed: false });
		expect((await cohortDetail(cohortId))!.members).toEqual([]);
		const lines = (await auditLines()).filter((l) => l.action === 'cohort.members').map((l) => l.detail);
		expect(lines).toEqual([`+${people.learner.email}`, `−${people.learner.email}`]);
	});

	test('a cohort that does not exist is refused', async () => {
		expect(await addMember(actor, 999999, people.learner.email)).toEqual({ ok: false, message: 'There is no such cohort.' });
	});
});

describe('due dates', () => {
	test('an Assignment outside the course is refused', async () => {
		expect(await setDueDate(actor, cohortId, 999999, new Date('2027-09-20T23:00:00Z'))).toEqual({ ok: false, message: 'That Assignment is not part of this cohort’s course.' });
	});

	test('setting, repeating and moving a date; a moved date lets the reminder go out again', async () => {
		await addMember(actor, cohortId, people.learner.email);
		const assignment = (await db.query.assignments.findFirst({ where: eq(assignments.slug, 'three-rungs') }))!;
		const row = () => db.query.cohortDueDates.findFirst({ where: and(eq(cohortDueDates.cohortId, cohortId), eq(cohortDueDates.assignmentId, assignment.id)) });
		const first = new Date('2027-09-20T23:00:00Z');
		expect(await setDueDate(actor, cohortId, assignment.id, first)).toMatchObject({ ok: true, changed: true });
		expect((await cohortDetail(cohortId))!.dues.find((d) => d.assignmentId === assignment.id)?.dueAt?.toISOString()).toBe(first.toISOString());

		// the reminder job, a day before the date: it claims the date and mails the member (who has sent nothing)
		const dayBefore = new Date(first.getTime() - 86_400_000);
		expect(await sendDueReminders(origin, dayBefore)).toBeGreaterThanOrEqual(1);
		expect((await row())!.remindedAt?.toISOString()).toBe(dayBefore.toISOString());

		// the same date again changes nothing: the reminder stays sent, no audit line
		expect(await setDueDate(actor, cohortId, assignment.id, first)).toMatchObject({ ok: true, changed: false });
		expect((await row())!.remindedAt).not.toBeNull();

		// moved a week: the reminder is due again before the new date, and the job sends it
		const moved = new Date('2027-09-27T23:00:00Z');
		expect(await setDueDate(actor, cohortId, assignment.id, moved)).toMatchObject({ ok: true, changed: true, message: `${assignment.title} is now due 2027-09-27 23:00 UTC.` });
		expect(await row()).toMatchObject({ dueAt: moved, remindedAt: null });
		const dayBeforeMoved = new Date(moved.getTime() - 86_400_000);
		expect(await sendDueReminders(origin, dayBeforeMoved)).toBeGreaterThanOrEqual(1);
		expect((await row())!.remindedAt?.toISOString()).toBe(dayBeforeMoved.toISOString());

		// taken away: no row, no reminder; twice changes nothing
		expect(await clearDueDate(actor, cohortId, assignment.id)).toEqual({ ok: true, changed: true, message: `${assignment.title} has no due date any more.` });
		expect(await row()).toBeUndefined();
		expect(await clearDueDate(actor, cohortId, assignment.id)).toMatchObject({ ok: true, changed: false });
		expect(await sendDueReminders(origin, dayBeforeMoved)).toBe(0);

		const lines = (await auditLines()).filter((l) => l.action === 'cohort.due-dates').map((l) => l.detail);
		expect(lines).toEqual(['due 2027-09-20 23:00 UTC', '2027-09-20 23:00 UTC → 2027-09-27 23:00 UTC', '2027-09-27 23:00 UTC → no due date']);
	});

	test('an enrolled member is shown as enrolled and told nothing more', async () => {
		const course = (await db.query.courses.findFirst({ where: eq(courses.slug, 'daylight-flash-for-action') }))!;
		await db.insert(enrolments).values({ userId: people.learner.id, courseId: course.id, status: 'active', source: 'admin' });
		try {
			await removeMember(actor, cohortId, people.learner.email);
			const added = await addMember(actor, cohortId, people.learner.email);
			expect(added).toEqual({ ok: true, changed: true, message: `${people.learner.name} joined Managed cohort (test).` });
			expect((await cohortDetail(cohortId))!.members).toMatchObject([{ email: people.learner.email, enrolled: true }]);
		} finally {
			await db.delete(enrolments).where(eq(enrolments.userId, people.learner.id));
		}
	});
});

describe('the field-day page and the upload link', () => {
	test('a booked-or-not learner without enrolment is not offered the upload; staff with course access are', async () => {
		const outsider = await fieldDayPage('trail-running-first-light', { id: people.learner.id, roles: ['learner'] });
		expect(outsider?.upload).toMatchObject({ allowed: false });
		const admin = (await db.query.users.findFirst({ where: eq(users.email, demoAccount('admin').email) }))!;
		const staff = await fieldDayPage('trail-running-first-light', { id: admin.id, roles: admin.roles });
		expect(staff?.upload).toMatchObject({ allowed: true });
	});
});

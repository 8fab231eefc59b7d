// Reminder e-mails before cohort due dates: a pg-boss cron job (`cohort-due-reminders`) finds due dates coming up and
// mails each member who has not sent an Attempt yet, once per cohort and Assignment.
import { and, eq, gt, isNull, lte, sql } from 'drizzle-orm';
import type PgBoss from 'pg-boss';
import { ensureQueue } from '../attempts/queue';
import { db } from '../db';
import { assignments, cohortDueDates, cohortMembers, cohorts, courses, lessons, users } from '../db/schema';
import { sendLetter } from '../mail';
import { compose } from '../mail-letters';
import { assignmentPath } from '../../attempts/paths';

export const REMINDER_QUEUE = 'cohort-due-reminders';
export const REMINDER_CRON = '7 * * * *';
/** How long before a due date the reminder goes out. */
export const REMIND_HOURS_BEFORE = 48;

export async function ensureReminderQueue(boss: PgBoss): Promise<void> {
	await ensureQueue(boss, REMINDER_QUEUE, { retryLimit: 2, expireInSeconds: 15 * 60 });
}

/**
 * Claims each due date in the window (remindedAt set in the same statement, so two workers never both mail), then
 * mails the members who have no Attempt for it yet. Returns how many e-mails were sent.
 */
export async function sendDueReminders(origin: string, now = new Date()): Promise<number> {
	const until = new Date(now.getTime() + REMIND_HOURS_BEFORE * 3_600_000);
	const claimed = await db
		.update(cohortDueDates)
		.set({ remindedAt: now })
		.where(and(isNull(cohortDueDates.remindedAt), gt(cohortDueDates.dueAt, now), lte(cohortDueDates.dueAt, until)))
		.returning({ cohortId: cohortDueDates.cohortId, assignmentId: cohortDueDates.assignmentId, dueAt: cohortDueDates.dueAt });
	let sent = 0;
	for (const due of claimed) {
		const members = await db
			.select({ email: users.email, name: users.name, cohort: cohorts.title, assignment: assignments.title, assignmentSlug: assignments.slug, lesson: lessons.slug, course: courses.slug })
			.from(cohortMembers)
			.innerJoin(users, eq(users.id, cohortMembers.userId))
			.innerJoin(cohorts, eq(cohorts.id, cohortMembers.cohortId))
			.innerJoin(courses, eq(courses.id, cohorts.courseId))
			.innerJoin(assignments, eq(assignments.id, due.assignmentId))
			.innerJoin(lessons, eq(lessons.id, assignments.lessonId))
			.where(
				and(
					eq(cohortMembers.cohortId, due.cohortId),
					sql`not exists (select 1 from attempts a where a.user_id = ${cohortMembers.userId} and a.assignment_id = ${due.assignmentId})`
				)
			);
		const when = new Intl.DateTimeFormat('en', { dateStyle: 'full', timeStyle: 'short', timeZone: 'UTC' }).format(due.dueAt);
		for (const m of members) {
			const href = `${origin}${assignmentPath(m.course, m.lesson, m.assignmentSlug)}`;
			const result = await sendLetter(
				compose(m.email, `Due soon: ${m.assignment}`, [`Hello ${m.name},`, `Your cohort “${m.cohort}” has “${m.assignment}” due on ${when} UTC. Send your frames before then so your mentor can critique them with the group’s.`], { href, label: 'Open the Assignment' })
			);
			if (result.ok) sent++;
		}
	}
	return sent;
}

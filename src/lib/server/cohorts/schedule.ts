// A cohort's schedule: its due dates with each member's state (submitted, due, overdue), for learners and for the review queue.
import { and, asc, eq, sql } from 'drizzle-orm';
import { db } from '../db';
import { assignments, cohortDueDates, cohortMembers, cohorts, courses, lessons, users } from '../db/schema';
import { assignmentPath } from '$lib/attempts/paths';

export type DueState = 'submitted' | 'due' | 'overdue';

export function dueState(dueAt: Date, firstAttemptAt: Date | null, now: Date): DueState {
	if (firstAttemptAt) return 'submitted';
	return dueAt.getTime() < now.getTime() ? 'overdue' : 'due';
}

/** The cohorts a learner belongs to, each with its due dates and whether the learner has sent an Attempt for each. */
export async function learnerCohorts(userId: string, now = new Date()) {
	const rows = await db
		.select({
			cohort: { id: cohorts.id, slug: cohorts.slug, title: cohorts.title },
			course: { slug: courses.slug, title: courses.title },
			mentor: users.name,
			dueAt: cohortDueDates.dueAt,
			assignment: { id: assignments.id, slug: assignments.slug, title: assignments.title },
			lesson: lessons.slug,
			firstAttemptAt: sql<Date | null>`(select min(a.created_at) from attempts a where a.user_id = ${userId} and a.assignment_id = ${assignments.id})`.mapWith((v) => (v ? new Date(v) : null))
		})
		.from(cohortMembers)
		.innerJoin(cohorts, eq(cohorts.id, cohortMembers.cohortId))
		.innerJoin(courses, eq(courses.id, cohorts.courseId))
		.leftJoin(users, eq(users.id, cohorts.mentorId))
		.innerJoin(cohortDueDates, eq(cohortDueDates.cohortId, cohorts.id))
		.innerJoin(assignments, eq(assignments.id, cohortDueDates.assignmentId))
		.innerJoin(lessons, eq(lessons.id, assignments.lessonId))
		.where(eq(cohortMembers.userId, userId))
		.orderBy(asc(cohorts.startsAt), asc(cohortDueDates.dueAt));
	const byCohort = new Map<number, { slug: string; title: string; course: { slug: string; title: string }; mentor: string | null; items: { assignment: string; href: string; dueAt: Date; state: DueState }[] }>();
	for (const r of rows) {
		const entry = byCohort.get(r.cohort.id) ?? { slug: r.cohort.slug, title: r.cohort.title, course: r.course, mentor: r.mentor, items: [] };
		entry.items.push({ assignment: r.assignment.title, href: assignmentPath(r.course.slug, r.lesson, r.assignment.slug), dueAt: r.dueAt, state: dueState(r.dueAt, r.firstAttemptAt, now) });
		byCohort.set(r.cohort.id, entry);
	}
	return [...byCohort.values()];
}

/** For the review queue's filter. */
export async function cohortOptions() {
	return db.select({ slug: cohorts.slug, title: cohorts.title }).from(cohorts).orderBy(asc(cohorts.startsAt), asc(cohorts.title));
}

export type Overdue = { learner: string; assignment: string; dueAt: string };

/** Members of a cohort past a due date with no Attempt for that Assignment. */
export async function overdueInCohort(slug: string, now = new Date()): Promise<Overdue[]> {
	const rows = await db
		.select({ learner: users.name, assignment: assignments.title, dueAt: cohortDueDates.dueAt })
		.from(cohorts)
		.innerJoin(cohortDueDates, eq(cohortDueDates.cohortId, cohorts.id))
		.innerJoin(assignments, eq(assignments.id, cohortDueDates.assignmentId))
		.innerJoin(cohortMembers, eq(cohortMembers.cohortId, cohorts.id))
		.innerJoin(users, eq(users.id, cohortMembers.userId))
		.where(
			and(
				eq(cohorts.slug, slug),
				sql`${cohortDueDates.dueAt} < ${now.toISOString()}::timestamptz`,
				sql`not exists (select 1 from attempts a where a.user_id = ${cohortMembers.userId} and a.assignment_id = ${cohortDueDates.assignmentId})`
			)
		)
		.orderBy(asc(cohortDueDates.dueAt), asc(users.name));
	return rows.map((r) => ({ learner: r.learner, assignment: r.assignment, dueAt: r.dueAt.toISOString() }));
}

/** Due dates of the learner's cohorts, for the private calendar feed. */
export async function dueDatesFor(userId: string) {
	return db
		.select({ cohortId: cohorts.id, cohort: cohorts.title, assignmentId: assignments.id, assignment: assignments.title, dueAt: cohortDueDates.dueAt })
		.from(cohortMembers)
		.innerJoin(cohorts, eq(cohorts.id, cohortMembers.cohortId))
		.innerJoin(cohortDueDates, eq(cohortDueDates.cohortId, cohorts.id))
		.innerJoin(assignments, eq(assignments.id, cohortDueDates.assignmentId))
		.where(eq(cohortMembers.userId, userId));
}


// Reports as CSV (csv-stringify): per field day (attendance, briefing, the day's Attempts, verdicts, time to critique)
// and per cohort (each member and due date: on time, late or missing, verdict, time to critique).
import { stringify } from 'csv-stringify/sync';
import { asc, eq, sql } from 'drizzle-orm';
import { db } from '../db';
import { cohortDueDates, cohortMembers, cohorts, fieldDayBookings, fieldDays, users, assignments } from '../db/schema';

const iso = (d: Date | string | null) => (d ? new Date(d).toISOString() : '');
/** Hours with one decimal, or empty when there is no critique yet. */
export const hoursBetween = (from: Date | string | null, to: Date | string | null) => (from && to ? ((new Date(to).getTime() - new Date(from).getTime()) / 3_600_000).toFixed(1) : '');

/** The first Attempt of a learner for an Assignment from a moment on, its verdict and its critique's time. */
function firstAttempt(userId: unknown, assignmentId: unknown, since: unknown) {
	return sql<{ created_at: string; verdict: string | null; critiqued_at: string | null; count: number } | null>`(
		select json_build_object('created_at', a.created_at, 'verdict', a.verdict, 'critiqued_at', c.created_at,
			'count', (select count(*) from attempts x where x.user_id = ${userId} and x.assignment_id = ${assignmentId} and x.created_at >= ${since}))
		from attempts a left join critiques c on c.attempt_id = a.id
		where a.user_id = ${userId} and a.assignment_id = ${assignmentId} and a.created_at >= ${since}
		order by a.created_at asc limit 1)`;
}

export async function fieldDayReportCsv(slug: string): Promise<string | null> {
	const day = await db.query.fieldDays.findFirst({ where: eq(fieldDays.slug, slug) });
	if (!day) return null;
	const rows = await db
		.select({
			name: users.name,
			email: users.email,
			status: fieldDayBookings.status,
			acknowledgedAt: fieldDayBookings.briefingAcknowledgedAt,
			onDayAt: fieldDayBookings.briefingOnDayAt,
			attendedAt: fieldDayBookings.attendedAt,
			attempt: day.assignmentId ? firstAttempt(fieldDayBookings.userId, day.assignmentId, day.startsAt.toISOString()) : sql<null>`null`
		})
		.from(fieldDayBookings)
		.innerJoin(users, eq(users.id, fieldDayBookings.userId))
		.where(eq(fieldDayBookings.fieldDayId, day.id))
		.orderBy(asc(users.name));
	return stringify(
		rows.map((r) => ({
			learner: r.name,
			email: r.email,
			booking: r.status,
			briefing_when_booking: iso(r.acknowledgedAt),
			briefing_on_the_day: iso(r.onDayAt),
			came: r.attendedAt ? 'yes' : 'no',
			attempts: r.attempt?.count ?? 0,
			first_attempt: iso(r.attempt?.created_at ?? null),
			verdict: r.attempt?.verdict ?? '',
			hours_to_critique: hoursBetween(r.attempt?.created_at ?? null, r.attempt?.critiqued_at ?? null)
		})),
		{ header: true, columns: ['learner', 'email', 'booking', 'briefing_when_booking', 'briefing_on_the_day', 'came', 'attempts', 'first_attempt', 'verdict', 'hours_to_critique'] }
	);
}

export async function cohortReportCsv(slug: string): Promise<string | null> {
	const cohort = await db.query.cohorts.findFirst({ where: eq(cohorts.slug, slug) });
	if (!cohort) return null;
	const rows = await db
		.select({
			name: users.name,
			email: users.email,
			assignment: assignments.title,
			dueAt: cohortDueDates.dueAt,
			attempt: firstAttempt(cohortMembers.userId, cohortDueDates.assignmentId, cohort.startsAt.toISOString())
		})
		.from(cohortMembers)
		.innerJoin(users, eq(users.id, cohortMembers.userId))
		.innerJoin(cohortDueDates, eq(cohortDueDates.cohortId, cohortMembers.cohortId))
		.innerJoin(assignments, eq(assignments.id, cohortDueDates.assignmentId))
		.where(eq(cohortMembers.cohortId, cohort.id))
		.orderBy(asc(users.name), asc(cohortDueDates.dueAt));
	const now = Date.now();
	return stringify(
		rows.map((r) => {
			const sent = r.attempt?.created_at ? new Date(r.attempt.created_at) : null;
			const state = sent ? (sent.getTime() <= r.dueAt.getTime() ? 'on time' : 'late') : r.dueAt.getTime() < now ? 'missing' : 'not yet due';
			return {
				learner: r.name,
				email: r.email,
				assignment: r.assignment,
				due: iso(r.dueAt),
				state,
				attempts: r.attempt?.count ?? 0,
				first_attempt: iso(sent),
				verdict: r.attempt?.verdict ?? '',
				hours_to_critique: hoursBetween(sent, r.attempt?.critiqued_at ?? null)
			};
		}),
		{ header: true, columns: ['learner', 'email', 'assignment', 'due', 'state', 'attempts', 'first_attempt', 'verdict', 'hours_to_critique'] }
	);
}

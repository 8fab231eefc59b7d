// Managing cohorts (authors and admins): the list, making one, members added and removed by e-mail, a due date per
// Assignment of the course. Each change writes one audit line in its own transaction; a repeat that changes nothing
// writes none. A moved due date clears `remindedAt`, so the reminder goes out again before the new date.
import { and, asc, arrayContains, count, desc, eq, sql } from 'drizzle-orm';
import { recordAudit, type Actor } from '../audit';
import { db } from '../db';
import { assignments, cohortDueDates, cohortMembers, cohorts, courses, enrolments, lessons, modules, users } from '../db/schema';
import { hasCourseAccess } from '../enrolment-access';
import type { CohortForm } from '$lib/forms/cohorts';

export type CohortSave = { ok: true; id: number } | { ok: false; field?: keyof CohortForm; message: string };
export type Change = { ok: true; changed: boolean; message: string } | { ok: false; message: string };

const utcText = (d: Date) => `${d.toISOString().slice(0, 16).replace('T', ' ')} UTC`;

/** Every cohort with its course, mentor and head count, newest start first. */
export async function listCohorts() {
	const members = db.select({ cohortId: cohortMembers.cohortId, n: count().as('n') }).from(cohortMembers).groupBy(cohortMembers.cohortId).as('m');
	return db
		.select({ id: cohorts.id, slug: cohorts.slug, title: cohorts.title, course: courses.title, mentor: users.name, startsAt: cohorts.startsAt, members: sql<number>`coalesce(${members.n}, 0)::int` })
		.from(cohorts)
		.innerJoin(courses, eq(courses.id, cohorts.courseId))
		.leftJoin(users, eq(users.id, cohorts.mentorId))
		.leftJoin(members, eq(members.cohortId, cohorts.id))
		.orderBy(desc(cohorts.startsAt), asc(cohorts.title));
}

/** What the cohort form offers: the courses and the mentors. */
export async function cohortFormOptions() {
	const [courseRows, mentors] = await Promise.all([
		db.select({ slug: courses.slug, title: courses.title }).from(courses).orderBy(asc(courses.title)),
		db.select({ email: users.email, name: users.name }).from(users).where(arrayContains(users.roles, ['mentor'])).orderBy(asc(users.name))
	]);
	return { courses: courseRows, mentors };
}

export async function createCohort(actor: Actor, form: CohortForm): Promise<CohortSave> {
	const course = await db.query.courses.findFirst({ where: eq(courses.slug, form.courseSlug) });
	if (!course) return { ok: false, field: 'courseSlug', message: 'There is no course with that address.' };
	let mentorId: string | null = null;
	if (form.mentorEmail) {
		const mentor = await db.query.users.findFirst({ where: eq(users.email, form.mentorEmail) });
		if (!mentor || !mentor.roles.includes('mentor')) return { ok: false, field: 'mentorEmail', message: `Not a mentor here: ${form.mentorEmail}.` };
		mentorId = mentor.id;
	}
	const id = await db.transaction(async (tx) => {
		const rows = await tx
			.insert(cohorts)
			.values({ slug: form.slug, title: form.title, courseId: course.id, mentorId, startsAt: new Date(`${form.startsOn}T00:00:00Z`) })
			.onConflictDoNothing({ target: cohorts.slug })
			.returning({ id: cohorts.id });
		if (rows.length === 0) return null;
		await recordAudit(tx, actor, {
			action: 'cohort.create',
			subject: `${form.title} in ${course.title}`,
			detail: `starts ${form.startsOn}${form.mentorEmail ? `, mentor ${form.mentorEmail}` : ''}`,
			href: `/author/cohorts/${rows[0].id}`
		});
		return rows[0].id;
	});
	if (id === null) return { ok: false, field: 'slug', message: 'Another cohort already has this address.' };
	return { ok: true, id };
}

/** One cohort for its page: members, and every Assignment of the course with its due date (if set). */
export async function cohortDetail(id: number) {
	const [cohort] = await db
		.select({ id: cohorts.id, slug: cohorts.slug, title: cohorts.title, courseId: cohorts.courseId, course: courses.title, courseSlug: courses.slug, mentor: users.name, startsAt: cohorts.startsAt })
		.from(cohorts)
		.innerJoin(courses, eq(courses.id, cohorts.courseId))
		.leftJoin(users, eq(users.id, cohorts.mentorId))
		.where(eq(cohorts.id, id));
	if (!cohort) return null;
	const [members, dues] = await Promise.all([
		db
			.select({ email: users.email, name: users.name, joinedAt: cohortMembers.joinedAt, enrolled: sql<boolean>`${enrolments.id} is not null` })
			.from(cohortMembers)
			.innerJoin(users, eq(users.id, cohortMembers.userId))
			.leftJoin(enrolments, and(eq(enrolments.userId, users.id), eq(enrolments.courseId, cohort.courseId), eq(enrolments.status, 'active')))
			.where(eq(cohortMembers.cohortId, id))
			.orderBy(asc(users.name)),
		db
			.select({ assignmentId: assignments.id, title: assignments.title, dueAt: cohortDueDates.dueAt, remindedAt: cohortDueDates.remindedAt })
			.from(assignments)
			.innerJoin(lessons, eq(lessons.id, assignments.lessonId))
			.innerJoin(modules, eq(modules.id, lessons.moduleId))
			.leftJoin(cohortDueDates, and(eq(cohortDueDates.assignmentId, assignments.id), eq(cohortDueDates.cohortId, id)))
			.where(eq(modules.courseId, cohort.courseId))
			.orderBy(asc(modules.position), asc(lessons.position), asc(assignments.position))
	]);
	return { cohort, members, dues };
}

async function cohortById(id: number) {
	return db.query.cohorts.findFirst({ where: eq(cohorts.id, id) });
}

/** Adds a learner by e-mail; an unknown address or a person who is not a learner is told plainly; twice is harmless. */
export async function addMember(actor: Actor, cohortId: number, email: string): Promise<Change> {
	const cohort = await cohortById(cohortId);
	if (!cohort) return { ok: false, message: 'There is no such cohort.' };
	const person = await db.query.users.findFirst({ where: eq(users.email, email.trim().toLowerCase()) });
	if (!person) return { ok: false, message: `No account uses ${email}. Ask them to sign up first, then add them.` };
	if (!person.roles.includes('learner')) return { ok: false, message: `${email} is not a learner here, so cannot join a cohort.` };
	const added = await db.transaction(async (tx) => {
		const rows = await tx.insert(cohortMembers).values({ cohortId, userId: person.id }).onConflictDoNothing().returning({ userId: cohortMembers.userId });
		if (rows.length === 0) return false;
		await recordAudit(tx, actor, { action: 'cohort.members', subject: cohort.title, detail: `+${person.email}`, href: `/author/cohorts/${cohortId}` });
		return true;
	});
	// joining does not need enrolment (a school may add people before they pay), but the author is told what it means
	const unpaid = !added || (await hasCourseAccess(person, cohort.courseId)) ? '' : ` They are not enrolled in the course yet: they see the cohort’s schedule, and can send Assignments once enrolled.`;
	return added ? { ok: true, changed: true, message: `${person.name} joined ${cohort.title}.${unpaid}` } : { ok: true, changed: false, message: `${person.name} is already in ${cohort.title}.` };
}

export async function removeMember(actor: Actor, cohortId: number, email: string): Promise<Change> {
	const cohort = await cohortById(cohortId);
	if (!cohort) return { ok: false, message: 'There is no such cohort.' };
	const person = await db.query.users.findFirst({ where: eq(users.email, email.trim().toLowerCase()) });
	if (!person) return { ok: false, message: `No account uses ${email}.` };
	const removed = await db.transaction(async (tx) => {
		const rows = await tx
			.delete(cohortMembers)
			.where(and(eq(cohortMembers.cohortId, cohortId), eq(cohortMembers.userId, person.id)))
			.returning({ userId: cohortMembers.userId });
		if (rows.length === 0) return false;
		await recordAudit(tx, actor, { action: 'cohort.members', subject: cohort.title, detail: `−${person.email}`, href: `/author/cohorts/${cohortId}` });
		return true;
	});
	return removed ? { ok: true, changed: true, message: `${person.name} left ${cohort.title}.` } : { ok: true, changed: false, message: `${person.name} was not in ${cohort.title}.` };
}

/**
 * Sets or moves the due date of one Assignment of the cohort's course. A moved date clears `remindedAt`, so the
 * reminder job mails again before the new date; the same date again changes nothing.
 */
export async function setDueDate(actor: Actor, cohortId: number, assignmentId: number, dueAt: Date): Promise<Change> {
	const cohort = await cohortById(cohortId);
	if (!cohort) return { ok: false, message: 'There is no such cohort.' };
	const [assignment] = await db
		.select({ id: assignments.id, title: assignments.title })
		.from(assignments)
		.innerJoin(lessons, eq(lessons.id, assignments.lessonId))
		.innerJoin(modules, eq(modules.id, lessons.moduleId))
		.where(and(eq(assignments.id, assignmentId), eq(modules.courseId, cohort.courseId)));
	if (!assignment) return { ok: false, message: 'That Assignment is not part of this cohort’s course.' };
	return db.transaction(async (tx) => {
		const [before] = await tx
			.select({ dueAt: cohortDueDates.dueAt })
			.from(cohortDueDates)
			.where(and(eq(cohortDueDates.cohortId, cohortId), eq(cohortDueDates.assignmentId, assignmentId)))
			.for('update');
		if (before && before.dueAt.getTime() === dueAt.getTime()) return { ok: true, changed: false, message: `${assignment.title} is already due ${utcText(dueAt)}.` } as const;
		await tx
			.insert(cohortDueDates)
			.values({ cohortId, assignmentId, dueAt })
			.onConflictDoUpdate({ target: [cohortDueDates.cohortId, cohortDueDates.assignmentId], set: { dueAt, remindedAt: null } });
		await recordAudit(tx, actor, {
			action: 'cohort.due-dates',
			subject: `${cohort.title}: ${assignment.title}`,
			detail: before ? `${utcText(before.dueAt)} → ${utcText(dueAt)}` : `due ${utcText(dueAt)}`,
			href: `/author/cohorts/${cohortId}`
		});
		return { ok: true, changed: true, message: `${assignment.title} is now due ${utcText(dueAt)}.` } as const;
	});
}

/** Takes one Assignment's due date away (its reminder with it); an Assignment without one changes nothing. */
export async function clearDueDate(actor: Actor, cohortId: number, assignmentId: number): Promise<Change> {
	const cohort = await cohortById(cohortId);
	if (!cohort) return { ok: false, message: 'There is no such cohort.' };
	return db.transaction(async (tx) => {
		const [removed] = await tx
			.delete(cohortDueDates)
			.where(and(eq(cohortDueDates.cohortId, cohortId), eq(cohortDueDates.assignmentId, assignmentId)))
			.returning({ dueAt: cohortDueDates.dueAt });
		const [assignment] = await tx.select({ title: assignments.title }).from(assignments).where(eq(assignments.id, assignmentId));
		const title = assignment?.title ?? 'That Assignment';
		if (!removed) return { ok: true, changed: false, message: `${title} has no due date in ${cohort.title}.` } as const;
		await recordAudit(tx, actor, { action: 'cohort.due-dates', subject: `${cohort.title}: ${title}`, detail: `${utcText(removed.dueAt)} → no due date`, href: `/author/cohorts/${cohortId}` });
		return { ok: true, changed: true, message: `${title} has no due date any more.` } as const;
	});
}

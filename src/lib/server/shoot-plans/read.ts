// What a learner's Shoot Plan says now, whether it opens an Assignment's uploads, and what waits for a mentor.
import { and, asc, desc, eq, ne, type SQL } from 'drizzle-orm';
import { DEFAULT_SHOOT_CHECKLIST } from '$lib/forms/shoot-plan';
import { db } from '../db/index';
import { assignments, lessons, modules, courses, shootPlans, users, type ShootPlan } from '../db/schema';
import type { AssignmentSpec } from '../grading/index';

/** The lines a learner confirms for this Assignment: the spec's own list, else ours. */
export function checklistFor(spec: AssignmentSpec): string[] {
	return spec.shootPlan?.checklist ?? [...DEFAULT_SHOOT_CHECKLIST];
}

/** The newest plan of a learner for an Assignment, with the name of the mentor who decided it. */
export async function latestPlan(userId: string, assignmentId: number): Promise<(ShootPlan & { mentorName: string | null }) | null> {
	const [row] = await db
		.select({ plan: shootPlans, mentorName: users.name })
		.from(shootPlans)
		.leftJoin(users, eq(shootPlans.mentorId, users.id))
		.where(and(eq(shootPlans.userId, userId), eq(shootPlans.assignmentId, assignmentId)))
		.orderBy(desc(shootPlans.createdAt), desc(shootPlans.id))
		.limit(1);
	return row ? { ...row.plan, mentorName: row.mentorName } : null;
}

/** Why uploads are still closed for this learner, or null when they are open. */
export async function planGateMessage(spec: AssignmentSpec, userId: string, assignmentId: number): Promise<string | null> {
	if (!spec.shootPlan) return null;
	const plan = await latestPlan(userId, assignmentId);
	if (plan?.status === 'approved') return null;
	if (plan?.status === 'waiting') return 'Your Shoot Plan is waiting for a mentor. Uploads open once it is approved. Nothing was stored.';
	if (plan?.status === 'returned') return 'A mentor sent your Shoot Plan back with a note. Revise it on the Assignment page; uploads open once it is approved. Nothing was stored.';
	return 'This Assignment asks for a Shoot Plan first. File it on the Assignment page; uploads open once a mentor approves it. Nothing was stored.';
}

/** Plans with the names a mentor reads beside them: learner, Assignment, lesson and course. */
function plansWithNames(where: SQL | undefined) {
	return db
		.select({
			plan: shootPlans,
			learner: { id: users.id, name: users.name, email: users.email },
			assignment: { id: assignments.id, title: assignments.title, brief: assignments.brief, slug: assignments.slug, spec: assignments.spec },
			lesson: { slug: lessons.slug, title: lessons.title },
			course: { slug: courses.slug, title: courses.title }
		})
		.from(shootPlans)
		.innerJoin(users, eq(shootPlans.userId, users.id))
		.innerJoin(assignments, eq(shootPlans.assignmentId, assignments.id))
		.innerJoin(lessons, eq(assignments.lessonId, lessons.id))
		.innerJoin(modules, eq(lessons.moduleId, modules.id))
		.innerJoin(courses, eq(modules.courseId, courses.id))
		.where(where);
}

/** Plans waiting for a decision, oldest first; a mentor never sees their own. */
export async function listWaitingPlans(mentorId: string) {
	const rows = await plansWithNames(and(eq(shootPlans.status, 'waiting'), ne(shootPlans.userId, mentorId)))
		.orderBy(asc(shootPlans.createdAt), asc(shootPlans.id))
		.limit(200);
	return rows.map((r) => ({ id: r.plan.id, createdAt: r.plan.createdAt, learner: r.learner.name, assignment: r.assignment.title, course: r.course.title }));
}

/** One plan with the names a mentor reads beside it. */
export async function loadPlanForMentor(planId: number) {
	const [row] = await plansWithNames(eq(shootPlans.id, planId));
	return row ?? null;
}

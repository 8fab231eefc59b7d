// Test setup for certificates: a learner's lessons completed and passing verdicts recorded straight in the database.
import { randomUUID } from 'node:crypto';
import { eq, sql } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { assignments, attempts, courses, lessonProgress, lessons, modules } from '$lib/server/db/schema';

export const DEMO_COURSE = 'daylight-flash-for-action';

async function courseLessons(courseSlug: string) {
	return db
		.select({ id: lessons.id })
		.from(lessons)
		.innerJoin(modules, eq(lessons.moduleId, modules.id))
		.innerJoin(courses, eq(modules.courseId, courses.id))
		.where(sql`${courses.slug} = ${courseSlug} and ${lessons.published}`);
}

export async function completeAllLessons(userId: string, courseSlug = DEMO_COURSE, leaveOut = 0): Promise<void> {
	const rows = await courseLessons(courseSlug);
	const done = rows.slice(0, rows.length - leaveOut);
	if (done.length) await db.insert(lessonProgress).values(done.map((l) => ({ userId, lessonId: l.id, completedAt: new Date() }))).onConflictDoNothing();
}

/** A graded Attempt with the verdict given for each Assignment of the course (all, or the first `count`). */
export async function recordVerdicts(userId: string, verdict: 'pass' | 'fail', courseSlug = DEMO_COURSE, count?: number): Promise<number[]> {
	const ids = (await courseLessons(courseSlug)).map((l) => l.id);
	const rows = await db
		.select({ id: assignments.id, spec: assignments.spec })
		.from(assignments)
		.where(sql`${assignments.lessonId} in ${ids}`)
		.orderBy(assignments.id);
	const chosen = rows.slice(0, count ?? rows.length);
	if (chosen.length) {
		await db.insert(attempts).values(
			chosen.map((a) => ({
				id: randomUUID(),
				userId,
				assignmentId: a.id,
				submissionKey: randomUUID(),
				status: 'graded' as const,
				autoVerdict: verdict,
				verdict,
				spec: a.spec,
				subjectBox: { x: 0.3, y: 0.2, w: 0.4, h: 0.6 },
				gradedAt: new Date()
			}))
		);
	}
	return chosen.map((a) => a.id);
}

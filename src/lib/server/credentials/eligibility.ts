// Whether a learner has earned a course's certificate: every published lesson complete, and enough counted Assignments passed.
import { and, asc, eq, inArray, isNotNull } from 'drizzle-orm';
import { db } from '../db';
import { assignments, attempts, courses, credentialRules, lessonProgress, lessons, modules } from '../db/schema';

export interface CourseStanding {
	courseId: number;
	courseSlug: string;
	courseTitle: string;
	lessons: { total: number; completed: number };
	/** the Assignments that count, in course order, each with whether the learner has a passing verdict */
	counted: { id: number; title: string; passed: boolean }[];
	/** how many counted Assignments must be passed (the author's minimum, else all of them) */
	required: number;
	eligible: boolean;
}

/** The minimum a course asks: the author's number kept within 0…counted, or every counted Assignment when unset. */
export function requiredPasses(minimum: number | null | undefined, counted: number): number {
	if (minimum === null || minimum === undefined) return counted;
	return Math.max(0, Math.min(minimum, counted));
}

export async function courseStanding(userId: string, courseSlug: string): Promise<CourseStanding | null> {
	const [course] = await db
		.select({ id: courses.id, slug: courses.slug, title: courses.title, minimum: credentialRules.minimumPassed })
		.from(courses)
		.leftJoin(credentialRules, eq(credentialRules.courseId, courses.id))
		.where(and(eq(courses.slug, courseSlug), eq(courses.published, true)))
		.limit(1);
	if (!course) return null;
	const lessonRows = await db
		.select({ id: lessons.id })
		.from(lessons)
		.innerJoin(modules, eq(lessons.moduleId, modules.id))
		.where(and(eq(modules.courseId, course.id), eq(lessons.published, true)));
	const lessonIds = lessonRows.map((l) => l.id);
	const [completedRows, countedRows] = lessonIds.length
		? await Promise.all([
				db
					.select({ lessonId: lessonProgress.lessonId })
					.from(lessonProgress)
					.where(and(eq(lessonProgress.userId, userId), inArray(lessonProgress.lessonId, lessonIds), isNotNull(lessonProgress.completedAt))),
				db
					.select({ id: assignments.id, title: assignments.title })
					.from(assignments)
					.innerJoin(lessons, eq(assignments.lessonId, lessons.id))
					.innerJoin(modules, eq(lessons.moduleId, modules.id))
					.where(and(inArray(assignments.lessonId, lessonIds), eq(assignments.countsForCredential, true)))
					.orderBy(asc(modules.position), asc(lessons.position), asc(assignments.position))
			])
		: [[], []];
	const countedIds = countedRows.map((a) => a.id);
	// the verdict the learner sees (the grader's, or a mentor's override) decides
	const passedRows = countedIds.length
		? await db
				.selectDistinct({ assignmentId: attempts.assignmentId })
				.from(attempts)
				.where(and(eq(attempts.userId, userId), inArray(attempts.assignmentId, countedIds), eq(attempts.verdict, 'pass')))
		: [];
	const passed = new Set(passedRows.map((p) => p.assignmentId));
	const counted = countedRows.map((a) => ({ id: a.id, title: a.title, passed: passed.has(a.id) }));
	const required = requiredPasses(course.minimum, counted.length);
	const completed = completedRows.length;
	return {
		courseId: course.id,
		courseSlug: course.slug,
		courseTitle: course.title,
		lessons: { total: lessonIds.length, completed },
		counted,
		required,
		eligible: lessonIds.length > 0 && completed === lessonIds.length && counted.filter((a) => a.passed).length >= required
	};
}

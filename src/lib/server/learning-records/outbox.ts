// Writing learning records: each event's statement goes into the outbox in the caller's transaction (or runner),
// then deliverSoon() wakes the sender. A statement whose id is already there is left alone (the same event twice).
import { and, count, eq, isNotNull } from 'drizzle-orm';
import { client, type Db } from '../db';
import { assignments, attempts, courses, learningRecords, lessonProgress, lessons, modules, type LearningRecordKind } from '../db/schema';
import { recordsOrigin } from './settings';
import { attemptSubmitted, courseCompleted, critiqueReceived, lessonCompleted, quizAnswered, verdictReceived, type AssignmentRef, type LessonRef, type RecordedStatement, type VerdictFacts } from './statements';

export type Runner = Db | Parameters<Parameters<Db['transaction']>[0]>[0];

/** NOTIFY channel the delivery worker listens on (`worker.ts`). */
export const DELIVERY_CHANNEL = 'stopwise_learning_records';

async function put(runner: Runner, kind: LearningRecordKind, userId: string, statement: RecordedStatement): Promise<void> {
	await runner
		.insert(learningRecords)
		.values({ id: statement.id, kind, userId, statement: statement as unknown as Record<string, unknown> })
		.onConflictDoNothing({ target: learningRecords.id });
}

async function lessonRef(runner: Runner, lessonId: number): Promise<LessonRef | null> {
	const [row] = await runner
		.select({ id: lessons.id, slug: lessons.slug, title: lessons.title, courseId: courses.id, courseSlug: courses.slug, courseTitle: courses.title })
		.from(lessons)
		.innerJoin(modules, eq(lessons.moduleId, modules.id))
		.innerJoin(courses, eq(modules.courseId, courses.id))
		.where(eq(lessons.id, lessonId));
	return row ? { id: row.id, slug: row.slug, title: row.title, course: { id: row.courseId, slug: row.courseSlug, title: row.courseTitle } } : null;
}

async function assignmentRef(runner: Runner, assignmentId: number): Promise<AssignmentRef | null> {
	const [row] = await runner
		.select({ slug: assignments.slug, title: assignments.title, courseId: courses.id, courseSlug: courses.slug, courseTitle: courses.title })
		.from(assignments)
		.innerJoin(lessons, eq(assignments.lessonId, lessons.id))
		.innerJoin(modules, eq(lessons.moduleId, modules.id))
		.innerJoin(courses, eq(modules.courseId, courses.id))
		.where(eq(assignments.id, assignmentId));
	return row ? { slug: row.slug, title: row.title, course: { id: row.courseId, slug: row.courseSlug, title: row.courseTitle } } : null;
}

/** Whether the learner has completed every published lesson of the course (and it has at least one). */
async function courseDone(runner: Runner, userId: string, courseId: number): Promise<boolean> {
	const published = and(eq(modules.courseId, courseId), eq(lessons.published, true));
	const [[all], [done]] = await Promise.all([
		runner.select({ n: count() }).from(lessons).innerJoin(modules, eq(lessons.moduleId, modules.id)).where(published),
		runner
			.select({ n: count() })
			.from(lessonProgress)
			.innerJoin(lessons, eq(lessonProgress.lessonId, lessons.id))
			.innerJoin(modules, eq(lessons.moduleId, modules.id))
			.where(and(published, eq(lessonProgress.userId, userId), isNotNull(lessonProgress.completedAt)))
	]);
	return all.n > 0 && done.n >= all.n;
}

/** A lesson completed (its first completion only) and, when it was the course's last, the course completed. */
export async function recordLessonCompleted(runner: Runner, userId: string, lessonId: number, at = new Date()): Promise<void> {
	const lesson = await lessonRef(runner, lessonId);
	if (!lesson) return;
	const origin = recordsOrigin();
	await put(runner, 'lesson-completed', userId, lessonCompleted(origin, userId, lesson, at));
	if (await courseDone(runner, userId, lesson.course.id)) await put(runner, 'course-completed', userId, courseCompleted(origin, userId, lesson.course, at));
}

export async function recordQuizAnswered(runner: Runner, userId: string, lessonId: number, quiz: { id: string; answer: string; correct: boolean }, at = new Date()): Promise<void> {
	const lesson = await lessonRef(runner, lessonId);
	if (lesson) await put(runner, 'quiz-answered', userId, quizAnswered(recordsOrigin(), userId, lesson, quiz, at));
}

export async function recordAttemptSubmitted(runner: Runner, userId: string, assignmentId: number, attemptId: string, at = new Date()): Promise<void> {
	const assignment = await assignmentRef(runner, assignmentId);
	if (assignment) await put(runner, 'attempt-submitted', userId, attemptSubmitted(recordsOrigin(), userId, assignment, attemptId, at));
}

async function attemptOwner(runner: Runner, attemptId: string) {
	const [row] = await runner.select({ userId: attempts.userId, assignmentId: attempts.assignmentId }).from(attempts).where(eq(attempts.id, attemptId));
	if (!row) return null;
	const assignment = await assignmentRef(runner, row.assignmentId);
	return assignment ? { userId: row.userId, assignment } : null;
}

export async function recordVerdict(runner: Runner, attemptId: string, facts: VerdictFacts, at = new Date()): Promise<void> {
	const owner = await attemptOwner(runner, attemptId);
	if (owner) await put(runner, 'verdict-received', owner.userId, verdictReceived(recordsOrigin(), owner.userId, owner.assignment, attemptId, facts, at));
}

export async function recordCritique(runner: Runner, attemptId: string, critique: { mentorId: string; rubric: Record<string, number> }, at = new Date()): Promise<void> {
	const owner = await attemptOwner(runner, attemptId);
	if (owner) await put(runner, 'critique-received', owner.userId, critiqueReceived(recordsOrigin(), owner.userId, owner.assignment, attemptId, critique, at));
}

/** Wakes the delivery worker in any process (after the event's transaction committed); its minute schedule is the fallback. */
export function deliverSoon(): void {
	void client.notify(DELIVERY_CHANNEL, '').catch(() => undefined);
}

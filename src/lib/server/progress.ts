// A learner's progress: lessons visited and completed, saved quiz answers, and where to pick up again.
import { and, desc, eq, inArray, isNotNull, or, sql, type SQL } from 'drizzle-orm';
import { client, db } from './db';
import { courses, enrolments, lessonProgress, lessons, modules, quizAnswers, type Role } from './db/schema';

import type { SavedQuizAnswers } from '../lessons/page-data';
import { deliverSoon, recordLessonCompleted, recordQuizAnswered } from './learning-records/outbox';

export type SavedAnswers = SavedQuizAnswers;

/** Notes the visit (for "Continue") and returns what the lesson page shows: completion and saved answers, in one round trip. */
export async function visitLesson(userId: string, lessonId: number): Promise<{ completed: boolean; quizAnswers: SavedAnswers }> {
	const [row] = await client<{ completed: boolean; answers: { quizId: string; answer: string; correct: boolean }[] }[]>`
		with visit as (
			insert into lesson_progress (user_id, lesson_id) values (${userId}, ${lessonId})
			on conflict (user_id, lesson_id) do update set last_visited_at = now()
			returning completed_at
		)
		select (select completed_at is not null from visit) as completed,
			coalesce((
				select json_agg(json_build_object('quizId', q.quiz_id, 'answer', q.answer, 'correct', q.correct))
				from quiz_answers q where q.user_id = ${userId} and q.lesson_id = ${lessonId}
			), '[]'::json) as answers`;
	return {
		completed: row.completed,
		quizAnswers: Object.fromEntries(row.answers.map((a) => [a.quizId, { answer: a.answer, correct: a.correct }]))
	};
}

/**
 * Marks a lesson complete (or not); completing again keeps the first completion time. The first completion (and the
 * course's, when it was the last lesson) is a learning record, written in the same transaction.
 */
export async function setLessonComplete(userId: string, lessonId: number, complete: boolean): Promise<void> {
	await db.transaction(async (tx) => {
		await tx
			.insert(lessonProgress)
			.values({ userId, lessonId, completedAt: complete ? new Date() : null })
			.onConflictDoUpdate({
				target: [lessonProgress.userId, lessonProgress.lessonId],
				set: { completedAt: complete ? sql`coalesce(${lessonProgress.completedAt}, now())` : null }
			});
		if (complete) await recordLessonCompleted(tx, userId, lessonId);
	});
	if (complete) deliverSoon();
}

/** Stores the newest answer to one quiz (one row per learner, lesson and quiz), and the answer as a learning record. */
export async function saveQuizAnswer(userId: string, lessonId: number, quizId: string, answer: string, correct: boolean): Promise<void> {
	await db.transaction(async (tx) => {
		const [row] = await tx
			.insert(quizAnswers)
			.values({ userId, lessonId, quizId, answer, correct })
			.onConflictDoUpdate({
				target: [quizAnswers.userId, quizAnswers.lessonId, quizAnswers.quizId],
				set: { answer, correct, answeredAt: sql`now()` }
			})
			.returning({ answeredAt: quizAnswers.answeredAt });
		await recordQuizAnswered(tx, userId, lessonId, { id: quizId, answer, correct }, row.answeredAt);
	});
	deliverSoon();
}

/** Completes the lesson once every one of its quizzes has a right answer; returns whether it is complete now. */
export async function completeIfQuizzesRight(userId: string, lessonId: number, quizIds: string[]): Promise<boolean> {
	if (quizIds.length === 0) return false;
	const right = await db
		.select({ quizId: quizAnswers.quizId })
		.from(quizAnswers)
		.where(and(eq(quizAnswers.userId, userId), eq(quizAnswers.lessonId, lessonId), eq(quizAnswers.correct, true), inArray(quizAnswers.quizId, quizIds)));
	if (right.length < quizIds.length) return false;
	await setLessonComplete(userId, lessonId, true);
	return true;
}

export type ResumePoint = { courseSlug: string; lessonSlug: string; lessonTitle: string };
type Learner = { id: string; roles: readonly Role[] };

/**
 * Lessons the person may open now: every lesson for staff; for learners a free lesson or one of a course with an
 * active enrolment. A refunded or revoked learner is never offered "Continue" into a paid lesson.
 */
function openToLearner(user: Learner): SQL | undefined {
	if (user.roles.some((r) => r !== 'learner')) return undefined;
	return or(
		eq(lessons.freePreview, true),
		sql`exists (select 1 from ${enrolments} e where e.user_id = ${user.id} and e.course_id = ${modules.courseId} and e.status = 'active')`
	);
}

/** The lessons of a course the learner completed (by slug) and the published lesson they opened last, if they may open it. */
export async function courseProgress(user: Learner, courseId: number): Promise<{ started: boolean; completed: string[]; resume: ResumePoint | null }> {
	const rows = await db
		.select({ slug: lessons.slug, title: lessons.title, completedAt: lessonProgress.completedAt, courseSlug: courses.slug, open: sql<boolean>`${openToLearner(user) ?? sql`true`}` })
		.from(lessonProgress)
		.innerJoin(lessons, eq(lessonProgress.lessonId, lessons.id))
		.innerJoin(modules, eq(lessons.moduleId, modules.id))
		.innerJoin(courses, eq(modules.courseId, courses.id))
		.where(and(eq(lessonProgress.userId, user.id), eq(modules.courseId, courseId), eq(lessons.published, true)))
		.orderBy(desc(lessonProgress.lastVisitedAt));
	const last = rows.find((r) => r.open);
	return {
		started: rows.length > 0,
		completed: rows.filter((r) => r.completedAt !== null).map((r) => r.slug),
		resume: last ? { courseSlug: last.courseSlug, lessonSlug: last.slug, lessonTitle: last.title } : null
	};
}

function resumeQuery(user: Learner) {
	return db
		.select({ courseSlug: courses.slug, lessonSlug: lessons.slug, lessonTitle: lessons.title })
		.from(lessonProgress)
		.innerJoin(lessons, eq(lessonProgress.lessonId, lessons.id))
		.innerJoin(modules, eq(lessons.moduleId, modules.id))
		.innerJoin(courses, eq(modules.courseId, courses.id))
		.where(and(eq(lessonProgress.userId, user.id), eq(lessons.published, true), eq(courses.published, true), isNotNull(lessonProgress.lastVisitedAt), openToLearner(user)));
}

/** For the catalogue: per course slug, the published lesson the person opened last among those they may open. */
export async function resumePoints(user: Learner): Promise<Record<string, ResumePoint>> {
	const rows = await db
		.selectDistinctOn([courses.id], { courseSlug: courses.slug, lessonSlug: lessons.slug, lessonTitle: lessons.title })
		.from(lessonProgress)
		.innerJoin(lessons, eq(lessonProgress.lessonId, lessons.id))
		.innerJoin(modules, eq(lessons.moduleId, modules.id))
		.innerJoin(courses, eq(modules.courseId, courses.id))
		.where(and(eq(lessonProgress.userId, user.id), eq(lessons.published, true), isNotNull(lessonProgress.lastVisitedAt), openToLearner(user)))
		.orderBy(courses.id, desc(lessonProgress.lastVisitedAt));
	return Object.fromEntries(rows.map((r) => [r.courseSlug, r]));
}

/** The one lesson to continue with after sign-in: the newest visit the person may still open, in any course. */
export async function latestResumePoint(user: Learner): Promise<ResumePoint | null> {
	const [row] = await resumeQuery(user).orderBy(desc(lessonProgress.lastVisitedAt)).limit(1);
	return row ?? null;
}

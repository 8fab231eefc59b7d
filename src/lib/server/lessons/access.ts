// The one rule for who may open a lesson, its quizzes and its Assignments, and its three answers: page, action, API.
import { error, json, redirect } from '@sveltejs/kit';
import { and, eq } from 'drizzle-orm';
import { db } from '../db';
import { courses, lessons, modules } from '../db/schema';
import { hasCourseAccess } from '../enrolment-access';
import { signInPath } from '../guards';
import type { AuthUser } from '../auth';

/** open: go ahead · sign-in: a visitor must sign in first · enrol: signed in, not enrolled · missing: no such thing. */
export type Access = 'open' | 'sign-in' | 'enrol' | 'missing';

export type Viewer = Pick<AuthUser, 'id' | 'roles'> | null;

/**
 * What is being opened: its course, and whether it is open to everyone (a free-preview lesson and its quizzes).
 * Assignments are never free: uploading needs an enrolment even on a free lesson. null when it does not exist.
 */
export type Guarded = { courseId: number; courseSlug: string; free: boolean } | null;

/** The rule: free things are open; the rest needs a signed-in person with course access (staff, or an active enrolment). */
export async function decideAccess(viewer: Viewer, what: Guarded): Promise<Access> {
	if (!what) return 'missing';
	if (what.free) return 'open';
	if (!viewer) return 'sign-in';
	return (await hasCourseAccess(viewer, what.courseId)) ? 'open' : 'enrol';
}

/** A published lesson of a published course, by its address: just what the rule needs (one query). */
export async function guardedLesson(courseSlug: string, lessonSlug: string): Promise<Guarded> {
	const [row] = await db
		.select({ courseId: courses.id, courseSlug: courses.slug, free: lessons.freePreview })
		.from(lessons)
		.innerJoin(modules, eq(lessons.moduleId, modules.id))
		.innerJoin(courses, eq(modules.courseId, courses.id))
		.where(and(eq(courses.slug, courseSlug), eq(lessons.slug, lessonSlug), eq(lessons.published, true), eq(courses.published, true)))
		.limit(1);
	return row ?? null;
}

/** An Assignment found for an upload or its page: never free, whatever its lesson. */
export function guardedAssignment(found: { course: { id: number; slug: string } } | null): Guarded {
	return found ? { courseId: found.course.id, courseSlug: found.course.slug, free: false } : null;
}

const MISSING_LESSON = 'There is no such lesson.';
const enrolMessage = (courseSlug: string) => `This part of the course opens once you are enrolled. See /courses/${courseSlug} to enrol.`;

/**
 * Lesson pages: a visitor goes to sign in and back, a learner without access to the course page's enrol offer
 * (naming the lesson they wanted), a missing lesson is a 404. Returns only when the access is open.
 */
export function lessonPageAccess(access: Access, at: { url: URL; courseSlug: string; lessonSlug: string }): void {
	if (access === 'missing') error(404, { message: MISSING_LESSON });
	if (access === 'sign-in') redirect(303, signInPath(at.url));
	if (access === 'enrol') redirect(303, `/courses/${at.courseSlug}?locked=${encodeURIComponent(at.lessonSlug)}`);
}

/** Other pages and form actions: sign in and back, a 403 page pointing to enrolment, or a 404 page with `missing`. */
export function actionAccess(access: Access, at: { url: URL; courseSlug: string; missing?: string }): void {
	if (access === 'missing') error(404, { message: at.missing ?? MISSING_LESSON });
	if (access === 'sign-in') redirect(303, signInPath(at.url));
	if (access === 'enrol') error(403, { message: enrolMessage(at.courseSlug) });
}

/** API routes: null when open, else the JSON 404/401/403 to return as is. */
export function apiAccess(access: Access, missing = MISSING_LESSON): Response | null {
	if (access === 'open') return null;
	if (access === 'missing') return json({ error: 'not-found', message: missing }, { status: 404 });
	if (access === 'sign-in') return json({ error: 'unauthenticated', message: 'Sign in first.' }, { status: 401 });
	return json({ error: 'not-enrolled', message: 'Enrol in this course first.' }, { status: 403 });
}

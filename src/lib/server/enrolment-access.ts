// Paid access: who may open a course's members-only lessons, upload its Assignments and call its API routes.
import { and, eq } from 'drizzle-orm';
import { error, json } from '@sveltejs/kit';
import { db } from './db';
import { enrolments } from './db/schema';
import type { AuthUser } from './auth';

/** Staff (mentors, authors, admins) see every course; learners need an active enrolment. */
export async function hasCourseAccess(user: Pick<AuthUser, 'id' | 'roles'> | null, courseId: number): Promise<boolean> {
	if (!user) return false;
	if (user.roles.some((r) => r === 'mentor' || r === 'author' || r === 'admin')) return true;
	const [row] = await db
		.select({ id: enrolments.id })
		.from(enrolments)
		.where(and(eq(enrolments.userId, user.id), eq(enrolments.courseId, courseId), eq(enrolments.status, 'active')))
		.limit(1);
	return Boolean(row);
}

/** For pages and form actions: a 403 page that points to enrolment unless the person has access. */
export async function requireCourseAccess(user: AuthUser, courseId: number, courseSlug: string): Promise<void> {
	if (!(await hasCourseAccess(user, courseId))) {
		error(403, { message: `This part of the course opens once you are enrolled. See /courses/${courseSlug} to enrol.` });
	}
}

/** For API routes: null when allowed, else a JSON 403 to return as is. */
export async function courseAccessResponse(user: AuthUser, courseId: number): Promise<Response | null> {
	if (await hasCourseAccess(user, courseId)) return null;
	return json({ error: 'not-enrolled', message: 'Enrol in this course first.' }, { status: 403 });
}

// Where each person lands after signing in without a page to return to: where their work is.
import { and, desc, eq } from 'drizzle-orm';
import { db } from './db';
import { courses, enrolments, users, type Role } from './db/schema';
import { latestResumePoint } from './progress';

/**
 * Admins → the people table, authors → their lessons, mentors → the review queue; a learner → the lesson they
 * opened last (if they may still open it), else the course they are enrolled in, else the catalogue.
 */
export async function landingPathFor(user: { id: string; roles: readonly Role[] }): Promise<string> {
	if (user.roles.includes('admin')) return '/admin/people';
	if (user.roles.includes('author')) return '/author';
	if (user.roles.includes('mentor')) return '/mentor';
	const resume = await latestResumePoint(user);
	if (resume) return `/courses/${resume.courseSlug}/${resume.lessonSlug}`;
	const [enrolled] = await db
		.select({ slug: courses.slug })
		.from(enrolments)
		.innerJoin(courses, eq(enrolments.courseId, courses.id))
		.where(and(eq(enrolments.userId, user.id), eq(enrolments.status, 'active'), eq(courses.published, true)))
		.orderBy(desc(enrolments.id))
		.limit(1);
	return enrolled ? `/courses/${enrolled.slug}` : '/courses';
}

/** The same, for a person known only by id (right after the password check). */
export async function landingPathForId(userId: string): Promise<string> {
	const [user] = await db.select({ id: users.id, roles: users.roles }).from(users).where(eq(users.id, userId)).limit(1);
	return user ? landingPathFor(user) : '/courses';
}

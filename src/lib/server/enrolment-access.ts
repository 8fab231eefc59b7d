// Paid access as a fact: whether a person may open a course's members-only parts (the rule using it: lessons/access.ts).
import { and, eq } from 'drizzle-orm';
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

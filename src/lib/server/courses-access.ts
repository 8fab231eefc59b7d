// Who may open a lesson without signing in: open lessons (and unknown slugs, so they get an honest 404).
import { and, eq } from 'drizzle-orm';
import { db } from './db';
import { courses, lessons, modules } from './db/schema';

export type LessonAccess = 'preview' | 'members' | 'missing';

/** Enrolment (paid access) is checked separately once payments exist; this only separates previews. */
export async function lessonAccess(courseSlug: string, lessonSlug: string): Promise<LessonAccess> {
	const [row] = await db
		.select({ free: lessons.freePreview })
		.from(lessons)
		.innerJoin(modules, eq(lessons.moduleId, modules.id))
		.innerJoin(courses, eq(modules.courseId, courses.id))
		.where(
			and(eq(courses.slug, courseSlug), eq(lessons.slug, lessonSlug), eq(lessons.published, true), eq(courses.published, true))
		)
		.limit(1);
	if (!row) return 'missing';
	return row.free ? 'preview' : 'members';
}

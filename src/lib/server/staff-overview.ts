// Overview for the mentors' landing page: every assignment, by course and lesson.
import { asc, eq } from 'drizzle-orm';
import { db } from './db';
import { assignments, courses, lessons, modules } from './db/schema';

export async function listAssignmentsForReview() {
	return db
		.select({ slug: assignments.slug, title: assignments.title, lesson: lessons.title, course: courses.title })
		.from(assignments)
		.innerJoin(lessons, eq(assignments.lessonId, lessons.id))
		.innerJoin(modules, eq(lessons.moduleId, modules.id))
		.innerJoin(courses, eq(modules.courseId, courses.id))
		.orderBy(asc(courses.title), asc(modules.position), asc(lessons.position), asc(assignments.position));
}

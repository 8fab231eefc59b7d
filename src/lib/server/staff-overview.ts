// Overviews for the staff landing pages: assignments (mentors) and every lesson with its state (authors).
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

export async function listLessonsForAuthors() {
	return db
		.select({
			course: courses.title,
			courseSlug: courses.slug,
			module: modules.title,
			slug: lessons.slug,
			title: lessons.title,
			published: lessons.published,
			source: lessons.source,
			updatedAt: lessons.updatedAt
		})
		.from(lessons)
		.innerJoin(modules, eq(lessons.moduleId, modules.id))
		.innerJoin(courses, eq(modules.courseId, courses.id))
		.orderBy(asc(courses.title), asc(modules.position), asc(lessons.position));
}

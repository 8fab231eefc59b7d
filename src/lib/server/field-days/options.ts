// What the scheduling form offers: courses and their Assignments, and the field days an author can open.
import { asc, desc, eq } from 'drizzle-orm';
import { db } from '../db';
import { assignments, courses, fieldDays, lessons, modules } from '../db/schema';
import { whenText } from './follow-ups';

export async function scheduleOptions() {
	const [courseRows, assignmentRows] = await Promise.all([
		db.select({ slug: courses.slug, title: courses.title }).from(courses).orderBy(asc(courses.title)),
		db
			.select({ slug: assignments.slug, title: assignments.title, course: courses.slug })
			.from(assignments)
			.innerJoin(lessons, eq(lessons.id, assignments.lessonId))
			.innerJoin(modules, eq(modules.id, lessons.moduleId))
			.innerJoin(courses, eq(courses.id, modules.courseId))
			.orderBy(asc(modules.position), asc(lessons.position), asc(assignments.position))
	]);
	return { courses: courseRows, assignments: assignmentRows };
}

export async function authorFieldDays() {
	const rows = await db.select().from(fieldDays).orderBy(desc(fieldDays.startsAt));
	return rows.map((d) => ({ id: d.id, slug: d.slug, title: d.title, when: whenText(d), seats: d.seats, status: d.status }));
}

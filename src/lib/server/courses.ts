// Reading the catalogue, a course outline and one lesson from PostgreSQL.
import { and, asc, eq } from 'drizzle-orm';
import { db } from './db';
import { assignments, courses, lessons, modules } from './db/schema';

export async function listCourses() {
	return db.query.courses.findMany({
		where: eq(courses.published, true),
		orderBy: asc(courses.title)
	});
}

/** A published course and its outline (modules, their published lessons in order), in one query; null when missing. */
export async function getCourseOutline(slug: string) {
	const rows = await db
		.select({
			course: courses,
			moduleSlug: modules.slug,
			moduleTitle: modules.title,
			moduleSummary: modules.summary,
			lessonSlug: lessons.slug,
			lessonTitle: lessons.title,
			lessonSummary: lessons.summary,
			freePreview: lessons.freePreview,
			minutes: lessons.minutes
		})
		.from(courses)
		.leftJoin(modules, eq(modules.courseId, courses.id))
		.leftJoin(lessons, and(eq(lessons.moduleId, modules.id), eq(lessons.published, true)))
		.where(and(eq(courses.slug, slug), eq(courses.published, true)))
		.orderBy(asc(modules.position), asc(lessons.position));
	if (rows.length === 0) return null;
	const outline: {
		slug: string;
		title: string;
		summary: string;
		lessons: { slug: string; title: string; summary: string; freePreview: boolean; minutes: number }[];
	}[] = [];
	for (const r of rows) {
		// a course without modules yet comes back as one row with no module
		if (r.moduleSlug === null) continue;
		let m = outline.at(-1);
		if (!m || m.slug !== r.moduleSlug) {
			m = { slug: r.moduleSlug, title: r.moduleTitle!, summary: r.moduleSummary!, lessons: [] };
			outline.push(m);
		}
		if (r.lessonSlug) {
			m.lessons.push({
				slug: r.lessonSlug,
				title: r.lessonTitle!,
				summary: r.lessonSummary!,
				freePreview: r.freePreview!,
				minutes: r.minutes!
			});
		}
	}
	return { course: rows[0].course, modules: outline };
}

/** A published lesson of a published course, with its module and course (one query); null when missing. */
export async function getLesson(courseSlug: string, lessonSlug: string) {
	const [row] = await db
		.select({ lesson: lessons, module: modules, course: courses })
		.from(lessons)
		.innerJoin(modules, eq(lessons.moduleId, modules.id))
		.innerJoin(courses, eq(modules.courseId, courses.id))
		.where(
			and(eq(courses.slug, courseSlug), eq(lessons.slug, lessonSlug), eq(lessons.published, true), eq(courses.published, true))
		)
		.limit(1);
	return row ?? null;
}

/** A lesson's Assignments in order. */
export async function lessonAssignments(lessonId: number) {
	return db.query.assignments.findMany({ where: eq(assignments.lessonId, lessonId), orderBy: asc(assignments.position) });
}

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

export async function getCourseOutline(slug: string) {
	const course = await db.query.courses.findFirst({ where: and(eq(courses.slug, slug), eq(courses.published, true)) });
	if (!course) return null;
	const rows = await db
		.select({
			moduleId: modules.id,
			moduleSlug: modules.slug,
			moduleTitle: modules.title,
			moduleSummary: modules.summary,
			lessonId: lessons.id,
			lessonSlug: lessons.slug,
			lessonTitle: lessons.title,
			lessonSummary: lessons.summary,
			freePreview: lessons.freePreview,
			minutes: lessons.minutes,
			published: lessons.published
		})
		.from(modules)
		.leftJoin(lessons, and(eq(lessons.moduleId, modules.id), eq(lessons.published, true)))
		.where(eq(modules.courseId, course.id))
		.orderBy(asc(modules.position), asc(lessons.position));
	const outline: {
		slug: string;
		title: string;
		summary: string;
		lessons: { slug: string; title: string; summary: string; freePreview: boolean; minutes: number }[];
	}[] = [];
	for (const r of rows) {
		let m = outline.at(-1);
		if (!m || m.slug !== r.moduleSlug) {
			m = { slug: r.moduleSlug, title: r.moduleTitle, summary: r.moduleSummary, lessons: [] };
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
	return { course, modules: outline };
}

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
	if (!row) return null;
	const lessonAssignments = await db.query.assignments.findMany({
		where: eq(assignments.lessonId, row.lesson.id),
		orderBy: asc(assignments.position)
	});
	return { ...row, assignments: lessonAssignments };
}

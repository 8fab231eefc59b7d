// Reading the catalogue, a course page and one lesson from PostgreSQL.
import { and, asc, eq } from 'drizzle-orm';
import { client, db } from './db';
import { courses, lessons, modules, type Course } from './db/schema';
import { courseGuide, type GuideRow } from './course-guide';

export async function listCourses() {
	return db.query.courses.findMany({
		where: eq(courses.published, true),
		orderBy: asc(courses.title)
	});
}

export type CourseOutlineModule = {
	slug: string;
	title: string;
	summary: string;
	lessons: { slug: string; title: string; summary: string; freePreview: boolean; minutes: number }[];
};

type CoursePageRow = Pick<Course, 'id' | 'slug' | 'title' | 'summary' | 'instructor' | 'currency'> & {
	price_cents: number;
	modules: CourseOutlineModule[];
	guide: GuideRow[];
};

/**
 * A published course with what its page shows, in one query: the outline (modules in order, each with its published
 * lessons in order; a module without any is listed empty) and the first-visit guide (every Assignment of a published
 * lesson, in reading order). null when there is no such course.
 */
export async function readCoursePage(slug: string) {
	const [row] = await client<CoursePageRow[]>`
		with course as (select * from courses where slug = ${slug} and published limit 1)
		select c.id, c.slug, c.title, c.summary, c.instructor, c.price_cents, c.currency,
			coalesce((
				select json_agg(json_build_object(
					'slug', m.slug, 'title', m.title, 'summary', m.summary,
					'lessons', coalesce((
						select json_agg(json_build_object('slug', l.slug, 'title', l.title, 'summary', l.summary,
							'freePreview', l.free_preview, 'minutes', l.minutes) order by l.position, l.id)
						from lessons l where l.module_id = m.id and l.published
					), '[]'::json)
				) order by m.position, m.id)
				from modules m where m.course_id = c.id
			), '[]'::json) as modules,
			coalesce((
				select json_agg(json_build_object('slug', a.slug, 'title', a.title, 'specText', a.spec::text,
					'lessonSlug', l.slug, 'lessonTitle', l.title, 'moduleTitle', m.title)
					order by m.position, m.id, l.position, l.id, a.position, a.id)
				from assignments a
				join lessons l on l.id = a.lesson_id
				join modules m on m.id = l.module_id
				where m.course_id = c.id and l.published
			), '[]'::json) as guide
		from course c`;
	if (!row) return null;
	const { price_cents, modules, guide, ...course } = row;
	return { course: { ...course, priceCents: price_cents }, modules, guide: courseGuide(guide) };
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


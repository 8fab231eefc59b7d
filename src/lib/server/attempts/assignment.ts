// Looks up an Assignment with its lesson and course, and its spec checked, for uploads and their pages.
import { and, eq } from 'drizzle-orm';
import { db } from '../db/index';
import { assignments, courses, lessons, modules } from '../db/schema';
import { validateSpec, type AssignmentSpec } from '../grading/index';

export interface AssignmentInfo {
	id: number;
	slug: string;
	title: string;
	brief: string;
	/** null when the stored spec no longer validates (an author's mistake): uploads are refused then */
	spec: AssignmentSpec | null;
	lesson: { slug: string; title: string };
	course: { id: number; slug: string; title: string };
}

const columns = {
	id: assignments.id,
	slug: assignments.slug,
	title: assignments.title,
	brief: assignments.brief,
	spec: assignments.spec,
	lessonSlug: lessons.slug,
	lessonTitle: lessons.title,
	courseId: courses.id,
	courseSlug: courses.slug,
	courseTitle: courses.title
};

type Row = Awaited<ReturnType<typeof query>>[number];

function shape(row: Row): AssignmentInfo {
	const checked = validateSpec(row.spec);
	return {
		id: row.id,
		slug: row.slug,
		title: row.title,
		brief: row.brief,
		spec: checked.ok ? checked.spec : null,
		lesson: { slug: row.lessonSlug, title: row.lessonTitle },
		course: { id: row.courseId, slug: row.courseSlug, title: row.courseTitle }
	};
}

function query() {
	return db
		.select(columns)
		.from(assignments)
		.innerJoin(lessons, eq(assignments.lessonId, lessons.id))
		.innerJoin(modules, eq(lessons.moduleId, modules.id))
		.innerJoin(courses, eq(modules.courseId, courses.id));
}

/** A published assignment by its slug (slugs are unique across courses). */
export async function findAssignment(slug: string): Promise<AssignmentInfo | null> {
	const [row] = await query()
		.where(and(eq(assignments.slug, slug), eq(lessons.published, true), eq(courses.published, true)))
		.limit(1);
	return row ? shape(row) : null;
}

/** The same, only when it belongs to this course and lesson (the upload page's URL). */
export async function findLessonAssignment(courseSlug: string, lessonSlug: string, slug: string): Promise<AssignmentInfo | null> {
	const found = await findAssignment(slug);
	return found && found.course.slug === courseSlug && found.lesson.slug === lessonSlug ? found : null;
}

/** By id, published or not: an attempt keeps its assignment even if a lesson is unpublished later. */
export async function findAssignmentById(id: number): Promise<AssignmentInfo | null> {
	const [row] = await query().where(eq(assignments.id, id)).limit(1);
	return row ? shape(row) : null;
}

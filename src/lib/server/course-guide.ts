// The course's first-visit guide: every Assignment in reading order, the frames it wants and the gear it asks for.
import { and, asc, eq } from 'drizzle-orm';
import { db } from './db';
import { assignments, lessons, modules } from './db/schema';
import { gearFor, type GearItem } from './grading/gear';

export interface GuideAssignment {
	slug: string;
	title: string;
	lessonSlug: string;
	lessonTitle: string;
	moduleTitle: string;
	frames: string[];
	gear: GearItem[];
}

/** Titles, frame names and gear only: an Assignment's brief stays behind enrolment with its lesson. */
export async function courseGuide(courseId: number): Promise<GuideAssignment[]> {
	const rows = await db
		.select({
			slug: assignments.slug,
			title: assignments.title,
			spec: assignments.spec,
			lessonSlug: lessons.slug,
			lessonTitle: lessons.title,
			moduleTitle: modules.title
		})
		.from(assignments)
		.innerJoin(lessons, eq(assignments.lessonId, lessons.id))
		.innerJoin(modules, eq(lessons.moduleId, modules.id))
		.where(and(eq(modules.courseId, courseId), eq(lessons.published, true)))
		.orderBy(asc(modules.position), asc(lessons.position), asc(assignments.position));
	return rows.map(({ spec, ...r }) => {
		const frames = (spec as { frames?: unknown }).frames;
		return { ...r, frames: Array.isArray(frames) ? frames.map(String) : [], gear: gearFor(spec) };
	});
}

// The lessons before and after one lesson in its course's reading order (modules, then lessons, published only).
import { and, asc, eq } from 'drizzle-orm';
import { db } from './db';
import { lessons, modules } from './db/schema';

import type { LessonLink, LessonPageData } from '../lessons/page-data';

export type { LessonLink };
export type LessonNeighbours = LessonPageData['neighbours'];

export async function lessonNeighbours(courseId: number, lessonId: number): Promise<LessonNeighbours> {
	const rows = await db
		.select({ id: lessons.id, slug: lessons.slug, title: lessons.title, moduleTitle: modules.title })
		.from(lessons)
		.innerJoin(modules, eq(lessons.moduleId, modules.id))
		.where(and(eq(modules.courseId, courseId), eq(lessons.published, true)))
		.orderBy(asc(modules.position), asc(lessons.position), asc(lessons.id));
	const at = rows.findIndex((r) => r.id === lessonId);
	const link = (i: number): LessonLink | null => {
		const r = at >= 0 ? rows[i] : undefined;
		return r ? { slug: r.slug, title: r.title, moduleTitle: r.moduleTitle } : null;
	};
	return { previous: link(at - 1), next: link(at + 1), position: at + 1, count: rows.length };
}

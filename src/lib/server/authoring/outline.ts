// The authors' tree (course → modules → lessons, drafts included) and moving modules and lessons up or down.
import { asc, desc, eq } from 'drizzle-orm';
import { db } from '../db';
import { courses, lessonVersions, lessons, modules } from '../db/schema';
import { differsFromPublished } from './versions';

export type Direction = 'up' | 'down';

export async function authorOutline() {
	const [courseRows, moduleRows, lessonRows, newest] = await Promise.all([
		db.select().from(courses).orderBy(asc(courses.title)),
		db.select().from(modules).orderBy(asc(modules.position), asc(modules.id)),
		db.select().from(lessons).orderBy(asc(lessons.position), asc(lessons.id)),
		// the newest version of each lesson: DISTINCT ON keeps the first row per lesson in this order
		db
			.selectDistinctOn([lessonVersions.lessonId], {
				lessonId: lessonVersions.lessonId,
				title: lessonVersions.title,
				summary: lessonVersions.summary,
				body: lessonVersions.body
			})
			.from(lessonVersions)
			.orderBy(lessonVersions.lessonId, desc(lessonVersions.createdAt), desc(lessonVersions.id))
	]);
	const drafts = new Map(newest.map((v) => [v.lessonId, v]));
	return courseRows.map((c) => ({
		id: c.id,
		slug: c.slug,
		title: c.title,
		modules: moduleRows
			.filter((m) => m.courseId === c.id)
			.map((m) => ({
				id: m.id,
				title: m.title,
				lessons: lessonRows
					.filter((l) => l.moduleId === m.id)
					.map((l) => {
						const draft = drafts.get(l.id);
						return {
							id: l.id,
							slug: l.slug,
							title: draft?.title ?? l.title,
							published: l.published,
							freePreview: l.freePreview,
							source: l.source,
							unpublishedChanges: draft ? differsFromPublished(l, draft) : !l.published
						};
					})
			}))
	}));
}

/** Swaps a module with its neighbour in the course and renumbers them all 1…n (so ties from old data go away). */
export async function moveModule(moduleId: number, direction: Direction): Promise<boolean> {
	return db.transaction(async (tx) => {
		const [mod] = await tx.select().from(modules).where(eq(modules.id, moduleId)).for('update');
		if (!mod) return false;
		const siblings = await tx.select().from(modules).where(eq(modules.courseId, mod.courseId)).orderBy(asc(modules.position), asc(modules.id)).for('update');
		const order = swapped(siblings.map((m) => m.id), moduleId, direction);
		if (!order) return false;
		for (const [i, id] of order.entries()) await tx.update(modules).set({ position: i + 1 }).where(eq(modules.id, id));
		return true;
	});
}

/** Swaps a lesson with its neighbour in the module and renumbers the module's lessons 1…n. */
export async function moveLesson(lessonId: number, direction: Direction): Promise<boolean> {
	return db.transaction(async (tx) => {
		const [lesson] = await tx.select().from(lessons).where(eq(lessons.id, lessonId)).for('update');
		if (!lesson) return false;
		const siblings = await tx.select().from(lessons).where(eq(lessons.moduleId, lesson.moduleId)).orderBy(asc(lessons.position), asc(lessons.id)).for('update');
		const order = swapped(siblings.map((l) => l.id), lessonId, direction);
		if (!order) return false;
		for (const [i, id] of order.entries()) await tx.update(lessons).set({ position: i + 1 }).where(eq(lessons.id, id));
		return true;
	});
}

/** The ids with `id` moved one place; null when it is already first (up) or last (down). */
export function swapped(ids: number[], id: number, direction: Direction): number[] | null {
	const at = ids.indexOf(id);
	const to = direction === 'up' ? at - 1 : at + 1;
	if (at < 0 || to < 0 || to >= ids.length) return null;
	const out = [...ids];
	[out[at], out[to]] = [out[to], out[at]];
	return out;
}

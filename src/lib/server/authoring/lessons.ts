// Lessons as authors handle them: open one for editing, create one, change its settings, delete an unused draft.
import { and, asc, eq, max } from 'drizzle-orm';
import { db } from '../db';
import { assignments, courses, lessonVersions, lessons, modules } from '../db/schema';
import type { NewLessonInput, SettingsInput } from '$lib/forms/authoring';
import { currentDraft, differsFromPublished, ensureDbLesson, type AuthoringResult } from './versions';

/** The lesson with its module, course, assignments and the draft the editor opens. */
export async function openLessonForEditing(lessonId: number) {
	const [row] = await db
		.select({ lesson: lessons, module: modules, course: courses })
		.from(lessons)
		.innerJoin(modules, eq(lessons.moduleId, modules.id))
		.innerJoin(courses, eq(modules.courseId, courses.id))
		.where(eq(lessons.id, lessonId))
		.limit(1);
	if (!row) return null;
	const [draft, lessonAssignments] = await Promise.all([
		currentDraft(row.lesson),
		db.query.assignments.findMany({ where: eq(assignments.lessonId, lessonId), orderBy: asc(assignments.position) })
	]);
	return { ...row, draft, assignments: lessonAssignments, unpublishedChanges: differsFromPublished(row.lesson, draft) };
}

export type CreateResult = { ok: true; lessonId: number } | { ok: false; field: 'moduleId' | 'slug'; message: string };

/** A new lesson, written in the browser from the start: unpublished, at the end of its module. */
export async function createLesson(input: NewLessonInput, authorId: string): Promise<CreateResult> {
	return db.transaction(async (tx) => {
		const mod = await tx.query.modules.findFirst({ where: eq(modules.id, input.moduleId) });
		if (!mod) return { ok: false, field: 'moduleId', message: 'That module no longer exists.' };
		// lesson addresses are /courses/<course>/<lesson>: a slug must be unique across the whole course
		const [clash] = await tx
			.select({ id: lessons.id })
			.from(lessons)
			.innerJoin(modules, eq(lessons.moduleId, modules.id))
			.where(and(eq(modules.courseId, mod.courseId), eq(lessons.slug, input.slug)))
			.limit(1);
		if (clash) return { ok: false, field: 'slug', message: 'Another lesson in this course has that slug.' };
		const [{ last }] = await tx.select({ last: max(lessons.position) }).from(lessons).where(eq(lessons.moduleId, mod.id));
		const [created] = await tx
			.insert(lessons)
			.values({
				moduleId: mod.id,
				slug: input.slug,
				title: input.title,
				summary: input.summary,
				minutes: input.minutes,
				freePreview: input.freePreview,
				position: (last ?? 0) + 1,
				source: 'db',
				body: '',
				published: false
			})
			.returning({ id: lessons.id });
		await tx.insert(lessonVersions).values({ lessonId: created.id, title: input.title, summary: input.summary, body: '', authorId, note: 'Created' });
		return { ok: true, lessonId: created.id };
	});
}

/** Reading time and the open-lesson setting apply at once (they are not part of the versioned text). */
export async function saveLessonSettings(lessonId: number, authorId: string, input: SettingsInput): Promise<AuthoringResult> {
	return db.transaction(async (tx) => {
		const [lesson] = await tx.select().from(lessons).where(eq(lessons.id, lessonId)).for('update');
		if (!lesson) return { ok: false, message: 'That lesson no longer exists.' };
		// the seed would reset a file lesson's settings: an edited lesson belongs to the database
		const moved = await ensureDbLesson(tx, lesson, authorId);
		if (!moved.ok) return moved;
		await tx.update(lessons).set({ minutes: input.minutes, freePreview: input.freePreview }).where(eq(lessons.id, lessonId));
		return { ok: true, message: input.freePreview ? 'Settings saved: anyone may read this lesson.' : 'Settings saved.' };
	});
}

/**
 * Deletes a lesson that learners never depend on: written in the browser, unpublished, with no assignments
 * (deleting would take quiz answers, progress and attempts with it otherwise).
 */
export async function deleteDraftLesson(lessonId: number): Promise<AuthoringResult> {
	return db.transaction(async (tx) => {
		const [lesson] = await tx.select().from(lessons).where(eq(lessons.id, lessonId)).for('update');
		if (!lesson) return { ok: false, message: 'That lesson no longer exists.' };
		if (lesson.source !== 'db') return { ok: false, message: 'Lessons from the course files cannot be deleted here; unpublish it instead.' };
		if (lesson.published) return { ok: false, message: 'Unpublish the lesson before deleting it.' };
		const [hasAssignment] = await tx.select({ id: assignments.id }).from(assignments).where(eq(assignments.lessonId, lessonId)).limit(1);
		if (hasAssignment) return { ok: false, message: 'This lesson has assignments (and maybe attempts): it cannot be deleted.' };
		await tx.delete(lessons).where(eq(lessons.id, lessonId));
		return { ok: true, message: `Deleted “${lesson.title}”.` };
	});
}

// The lesson page and the course page each read the database in one query: what they read equals what separate
// queries of the same tables say, and a change written straight into the database shows on the next read.
import { afterAll, describe, expect, test } from 'vitest';
import { and, asc, eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { assignments, courses, lessonClips, lessons, modules } from '$lib/server/db/schema';
import { readCoursePage } from '$lib/server/courses';
import { readLessonPageRows } from '$lib/server/lessons/page-query';
import { gearFor } from '$lib/server/grading/gear';

const COURSE = 'daylight-flash-for-action';

/** The course's published lessons in reading order, read the plain way. */
async function readingOrder() {
	return db
		.select({ id: lessons.id, slug: lessons.slug, title: lessons.title, moduleTitle: modules.title })
		.from(lessons)
		.innerJoin(modules, eq(lessons.moduleId, modules.id))
		.innerJoin(courses, eq(modules.courseId, courses.id))
		.where(and(eq(courses.slug, COURSE), eq(lessons.published, true)))
		.orderBy(asc(modules.position), asc(lessons.position), asc(lessons.id));
}

const restore: (() => Promise<unknown>)[] = [];
afterAll(async () => {
	for (const undo of restore.reverse()) await undo();
});

describe('the lesson page query', () => {
	test('every published lesson: its module, course, place in the reading order and neighbours', async () => {
		const order = await readingOrder();
		expect(order.length).toBeGreaterThan(2);
		for (const [i, l] of order.entries()) {
			const read = await readLessonPageRows(COURSE, l.slug);
			expect(read).not.toBeNull();
			expect(read!.lesson).toMatchObject({ id: l.id, slug: l.slug, title: l.title });
			expect(read!.lesson.updatedAt).toBeInstanceOf(Date);
			expect(read!.module.title).toBe(l.moduleTitle);
			expect(read!.course.slug).toBe(COURSE);
			const link = (j: number) => (order[j] ? { slug: order[j].slug, title: order[j].title, moduleTitle: order[j].moduleTitle } : null);
			expect(read!.neighbours).toEqual({ previous: link(i - 1), next: link(i + 1), position: i + 1, count: order.length });
		}
	});

	test('its Assignments in their order, spec and all', async () => {
		const [withOne] = await db
			.select({ lessonId: assignments.lessonId, slug: lessons.slug })
			.from(assignments)
			.innerJoin(lessons, eq(assignments.lessonId, lessons.id))
			.limit(1);
		const expected = await db.query.assignments.findMany({ where: eq(assignments.lessonId, withOne.lessonId), orderBy: asc(assignments.position) });
		const read = await readLessonPageRows(COURSE, withOne.slug);
		expect(read!.assignments).toEqual(expected.map(({ id, slug, title, brief, spec }) => ({ id, slug, title, brief, spec })));
	});

	test('its ready clips, oldest first, as the clips table holds them', async () => {
		const ready = await db.select().from(lessonClips).where(eq(lessonClips.status, 'ready')).orderBy(asc(lessonClips.createdAt));
		// the demo's clip is rendered at seed time when ffmpeg is there (the bootstrap installs it)
		expect(ready.length).toBeGreaterThan(0);
		const [withClip] = await db.select({ slug: lessons.slug }).from(lessons).where(eq(lessons.id, ready[0].lessonId));
		const read = await readLessonPageRows(COURSE, withClip.slug);
		const expected = ready.filter((c) => c.lessonId === ready[0].lessonId);
		expect(read!.clips).toEqual(
			expected.map(({ id, name, title, status, progress, error, durationSeconds, renditions, poster }) => ({ id, name, title, status, progress, error, durationSeconds, renditions, poster }))
		);
		// one still on its way (uploading) is left out until it is ready
		const [waiting] = await db
			.insert(lessonClips)
			.values({ id: crypto.randomUUID(), lessonId: ready[0].lessonId, name: `t-waiting-${Date.now()}`, title: 'Not yet', captions: 'WEBVTT\n' })
			.returning();
		restore.push(() => db.delete(lessonClips).where(eq(lessonClips.id, waiting.id)));
		expect((await readLessonPageRows(COURSE, withClip.slug))!.clips.map((c) => c.id)).toEqual(expected.map((c) => c.id));
		// a lesson without clips has none
		const without = await readLessonPageRows(COURSE, 'what-a-stop-is');
		expect(without!.clips).toEqual(await db.select().from(lessonClips).where(and(eq(lessonClips.lessonId, without!.lesson.id), eq(lessonClips.status, 'ready'))));
	});

	test('an unknown, unpublished or unpublished-course lesson is not found; a change in the database shows at once', async () => {
		expect(await readLessonPageRows(COURSE, 'no-such-lesson')).toBeNull();
		expect(await readLessonPageRows('no-such-course', 'guide-numbers')).toBeNull();
		const before = await readLessonPageRows(COURSE, 'guide-numbers');
		await db.update(lessons).set({ title: 'Guide numbers, retitled' }).where(eq(lessons.id, before!.lesson.id));
		restore.push(() => db.update(lessons).set({ title: before!.lesson.title }).where(eq(lessons.id, before!.lesson.id)));
		expect((await readLessonPageRows(COURSE, 'guide-numbers'))!.lesson.title).toBe('Guide numbers, retitled');
		// its neighbours name it by its new title
		const next = before!.neighbours.next!;
		expect((await readLessonPageRows(COURSE, next.slug))!.neighbours.previous!.title).toBe('Guide numbers, retitled');
		await db.update(lessons).set({ published: false }).where(eq(lessons.id, before!.lesson.id));
		restore.push(() => db.update(lessons).set({ published: true }).where(eq(lessons.id, before!.lesson.id)));
		expect(await readLessonPageRows(COURSE, 'guide-numbers')).toBeNull();
		// the others close the gap
		expect((await readLessonPageRows(COURSE, next.slug))!.neighbours).toMatchObject({
			previous: before!.neighbours.previous,
			count: before!.neighbours.count - 1
		});
	});
});

describe('the course page query', () => {
	test('the outline: modules in order, each with its published lessons in order', async () => {
		const page = await readCoursePage(COURSE);
		const order = await readingOrder();
		expect(page!.course).toMatchObject({ slug: COURSE, priceCents: expect.any(Number), currency: expect.any(String) });
		expect(page!.modules.flatMap((m) => m.lessons.map((l) => l.slug))).toEqual(order.map((l) => l.slug));
		const mods = await db.query.modules.findMany({ where: eq(modules.courseId, page!.course.id), orderBy: asc(modules.position) });
		expect(page!.modules.map((m) => m.slug)).toEqual(mods.map((m) => m.slug));
		expect(await readCoursePage('no-such-course')).toBeNull();
	});

	test('the guide: every Assignment of a published lesson with its frames and gear; a changed spec shows at once', async () => {
		const page = await readCoursePage(COURSE);
		const rows = await db
			.select({ slug: assignments.slug, spec: assignments.spec })
			.from(assignments)
			.innerJoin(lessons, eq(assignments.lessonId, lessons.id))
			.innerJoin(modules, eq(lessons.moduleId, modules.id))
			.where(and(eq(modules.courseId, page!.course.id), eq(lessons.published, true)))
			.orderBy(asc(modules.position), asc(lessons.position), asc(assignments.position));
		expect(page!.guide.map((g) => g.slug)).toEqual(rows.map((r) => r.slug));
		for (const [i, r] of rows.entries()) {
			expect(page!.guide[i].gear).toEqual(gearFor(r.spec));
			expect(page!.guide[i].frames).toEqual((r.spec as { frames?: string[] }).frames ?? []);
		}
		const first = rows[0];
		const changed = { ...(first.spec as object), frames: ['only-one'] };
		await db.update(assignments).set({ spec: changed as typeof first.spec }).where(eq(assignments.slug, first.slug));
		restore.push(() => db.update(assignments).set({ spec: first.spec }).where(eq(assignments.slug, first.slug)));
		expect((await readCoursePage(COURSE))!.guide[0].frames).toEqual(['only-one']);
	});
});

// Lessons written in the browser: drafts as versions, publish (refused with problems), restore, unpublish,
// a file lesson becoming a database lesson on its first edit, and the seed leaving it alone afterwards.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { assignments, lessonVersions, lessons } from '$lib/server/db/schema';
import { getLesson } from '$lib/server/courses';
import { seedDemo } from '$lib/server/seed';
import { createLesson, deleteDraftLesson, saveLessonSettings } from '$lib/server/authoring/lessons';
import { listVersions, publishDraft, restoreVersion, saveDraft, unpublishLesson } from '$lib/server/authoring/versions';
import { saveAssignment } from '$lib/server/authoring/assignments';
import { moveLesson } from '$lib/server/authoring/outline';
import { stripFrontmatter } from '$lib/server/lessons/source';
import { readFile } from 'node:fs/promises';
import { load as lessonLoad, actions as lessonActions } from '../../src/routes/(learn)/courses/[course]/[lesson]/+page.server';
import { actions as editorActions } from '../../src/routes/(author)/author/lessons/[id=integer]/+page.server';
import { demo, demoAccount, freshLearner, removeFreshPeople, signedInCookies, userIdOf } from './support/people';
import { failureOf, makeEvent, throughHooks, valueOf } from './support/request-event';
import { moduleIdOf } from './support/course';

const COURSE = 'daylight-flash-for-action';
const slug = `t-authoring-${Date.now().toString(36)}`;
let authorId: string;
let moduleId: number;
let lessonId: number;

beforeAll(async () => {
	authorId = await userIdOf(demoAccount('author').email);
	moduleId = await moduleIdOf(COURSE);
});

afterAll(async () => {
	await db.delete(lessons).where(eq(lessons.slug, slug));
});

const draft = (body: string, title = 'Reach at the rowing dock') => ({ title, summary: 'How far a small flash reaches.', body, note: '' });

describe('a lesson written in the browser', () => {
	test('is created unpublished, at the end of its module, with a first version', async () => {
		const created = await createLesson({ moduleId, slug, title: 'Reach at the rowing dock', summary: '', minutes: 8, freePreview: true }, authorId);
		if (!created.ok) throw new Error(created.message);
		lessonId = created.lessonId;
		const row = await db.query.lessons.findFirst({ where: eq(lessons.id, lessonId) });
		expect(row).toMatchObject({ source: 'db', published: false, body: '', freePreview: true });
		const siblings = await db.select({ position: lessons.position }).from(lessons).where(eq(lessons.moduleId, moduleId));
		expect(row!.position).toBe(Math.max(...siblings.map((s) => s.position)));
		expect(await getLesson(COURSE, slug)).toBeNull();
		expect((await listVersions(lessonId))!.versions.map((v) => v.note)).toEqual(['Created']);
	});

	test('refuses a second lesson with the same slug in the course', async () => {
		const again = await createLesson({ moduleId, slug, title: 'Copy', summary: '', minutes: 5, freePreview: false }, authorId);
		expect(again).toEqual({ ok: false, field: 'slug', message: 'Another lesson in this course has that slug.' });
	});

	test('saves drafts as versions without showing them to learners, and skips a save with no change', async () => {
		expect(await saveDraft(lessonId, authorId, draft('First words.'))).toMatchObject({ ok: true });
		expect(await saveDraft(lessonId, authorId, draft('First words.'))).toEqual({ ok: true, message: 'No changes since the last save.' });
		expect(await saveDraft(lessonId, authorId, { ...draft('Second words.\n\n<FalloffRuler gn="40" />'), note: 'added the ruler' })).toMatchObject({ ok: true });
		const { versions } = (await listVersions(lessonId))!;
		expect(versions.map((v) => v.note)).toEqual(['added the ruler', 'Draft', 'Created']);
		expect(versions[0].author).toBe((demo.find((d) => d.role === 'author') as { name?: string }).name);
		expect(await getLesson(COURSE, slug)).toBeNull();
	});

	test('will not publish text with problems, but keeps it as a draft', async () => {
		const bad = draft('Hello\n\n<script>alert(1)</script>\n\n<Evil />');
		const result = await publishDraft(lessonId, authorId, bad);
		expect(result).toMatchObject({ ok: false, problems: [expect.stringMatching(/<script> is not allowed/), expect.stringMatching(/<Evil> is not a lesson widget/)] });
		expect(await getLesson(COURSE, slug)).toBeNull();
		const { versions } = (await listVersions(lessonId))!;
		expect(versions[0]).toMatchObject({ body: bad.body, note: 'Draft (publishing was refused)' });
	});

	test('publishes: learners get the text rendered into segments', async () => {
		const good = draft('Reach first.\n\n<FalloffRuler gn="40" power="1/2" distance="2.5" iso="100" aperture="11" />\n\n<Quiz id="reach-1" question="GN 40 at 1/2 power?" answer="28.3" tolerance="0.5" />');
		expect(await publishDraft(lessonId, authorId, good)).toEqual({ ok: true, message: 'Published: learners now see this version.' });
		const found = await getLesson(COURSE, slug);
		expect(found?.lesson).toMatchObject({ published: true, body: good.body, title: good.title });
		const cookies = await signedInCookies(demoAccount('learner').email);
		const outcome = await throughHooks(makeEvent({ path: `/courses/${COURSE}/${slug}`, cookies, params: { course: COURSE, lesson: slug } }), (e) => lessonLoad(e as never));
		const data = valueOf<{ segments: unknown[] }>(outcome);
		expect(data.segments).toEqual([
			{ kind: 'html', html: '<p>Reach first.</p>' },
			{ kind: 'widget', name: 'FalloffRuler', props: { gn: '40', power: '1/2', distance: '2.5', iso: '100', aperture: '11' } },
			{ kind: 'widget', name: 'Quiz', props: { id: 'reach-1', question: 'GN 40 at 1/2 power?', answer: '28.3', tolerance: '0.5' } }
		]);
		expect(await publishDraft(lessonId, authorId, good)).toEqual({ ok: true, message: 'Already published as it stands.' });
		expect((await listVersions(lessonId))!.versions.filter((v) => v.live)).toHaveLength(1);
	});

	test('restores an older version as a new draft; learners keep the published one until it is published', async () => {
		const { versions } = (await listVersions(lessonId))!;
		const older = versions.find((v) => v.body === 'First words.')!;
		expect(await restoreVersion(lessonId, older.id, authorId)).toMatchObject({ ok: true });
		const after = (await listVersions(lessonId))!.versions;
		expect(after).toHaveLength(versions.length + 1);
		expect(after[0]).toMatchObject({ body: 'First words.', note: expect.stringMatching(/^Restored the version of /), live: false });
		expect((await getLesson(COURSE, slug))?.lesson.body).toContain('<FalloffRuler');
		expect(await restoreVersion(lessonId, 999_999_999, authorId)).toEqual({ ok: false, message: 'That version is not part of this lesson.' });
		expect(await publishDraft(lessonId, authorId, draft('First words.'))).toMatchObject({ ok: true });
		expect((await getLesson(COURSE, slug))?.lesson.body).toBe('First words.');
	});

	test('the editor’s publish action answers a bad form with field errors and stores nothing', async () => {
		const cookies = await signedInCookies(demoAccount('author').email);
		const before = (await listVersions(lessonId))!.versions.length;
		const event = makeEvent({ path: `/author/lessons/${lessonId}?/publish`, cookies, params: { id: String(lessonId) }, form: { title: '', summary: '', body: 'x' } });
		const outcome = await throughHooks(event, (e) => editorActions.publish(e as never));
		expect(failureOf((outcome as { value: unknown }).value)).toMatchObject({
			status: 400,
			data: { form: { message: { ok: false }, errors: { title: ['Give it a title.'] }, data: { body: 'x' } } }
		});
		expect((await listVersions(lessonId))!.versions.length).toBe(before);
		const learnerCookies = await signedInCookies(demoAccount('learner').email);
		const refused = await throughHooks(makeEvent({ path: `/author/lessons/${lessonId}?/publish`, cookies: learnerCookies, params: { id: String(lessonId) }, form: { title: 'x', body: 'y' } }), (e) => editorActions.publish(e as never));
		expect(refused).toMatchObject({ kind: 'error', status: 403 });
	});

	test('moves within its module, and unpublishes (the text stays)', async () => {
		const before = (await db.query.lessons.findFirst({ where: eq(lessons.id, lessonId) }))!.position;
		expect(await moveLesson(lessonId, 'up')).toBe(true);
		expect((await db.query.lessons.findFirst({ where: eq(lessons.id, lessonId) }))!.position).toBe(before - 1);
		expect(await moveLesson(lessonId, 'down')).toBe(true);
		expect(await unpublishLesson(lessonId)).toMatchObject({ ok: true });
		expect(await getLesson(COURSE, slug)).toBeNull();
		expect(await unpublishLesson(lessonId)).toEqual({ ok: false, message: 'The lesson is not published.' });
		expect((await db.query.lessons.findFirst({ where: eq(lessons.id, lessonId) }))!.body).toBe('First words.');
	});

	test('is deleted only while unpublished and without assignments', async () => {
		expect(await deleteDraftLesson(lessonId)).toMatchObject({ ok: true });
		expect(await db.query.lessons.findFirst({ where: eq(lessons.id, lessonId) })).toBeUndefined();
		expect(await db.select().from(lessonVersions).where(eq(lessonVersions.lessonId, lessonId))).toEqual([]);
	});
});

describe('a lesson from a content file, edited in the browser', () => {
	// a members-only lesson with an Assignment in its frontmatter
	const fileSlug = 'wide-and-close';
	let original: typeof lessons.$inferSelect;

	beforeAll(async () => {
		original = (await getLesson(COURSE, fileSlug))!.lesson;
	});

	afterAll(async () => {
		// put the demo lesson back as a content-file lesson: the seed then restores its fields and its assignment
		await db.delete(lessonVersions).where(eq(lessonVersions.lessonId, original.id));
		await db.update(lessons).set({ source: 'file', body: null }).where(eq(lessons.id, original.id));
		await seedDemo(db);
	});

	test('starts from the file’s Markdown (no frontmatter), kept as the first version', async () => {
		expect(original.source).toBe('file');
		const fileBody = stripFrontmatter(await readFile(original.contentPath!, 'utf8'));
		expect(await saveLessonSettings(original.id, authorId, { minutes: 13, freePreview: false })).toMatchObject({ ok: true });
		const row = await db.query.lessons.findFirst({ where: eq(lessons.id, original.id) });
		expect(row).toMatchObject({ source: 'db', body: fileBody, minutes: 13, published: true });
		expect(fileBody.startsWith('---')).toBe(false);
		const { versions } = (await listVersions(original.id))!;
		expect(versions).toEqual([expect.objectContaining({ body: fileBody, note: `Imported from ${original.contentPath}`, live: true })]);
	});

	test('keeps its edits and its assignment when the seed runs again', async () => {
		const assignment = (await db.query.assignments.findFirst({ where: eq(assignments.lessonId, original.id) }))!;
		const spec = JSON.stringify({ frames: ['ambient', 'lit'], criteria: [{ kind: 'subject-lift', minStops: 2 }] });
		expect(await saveAssignment(assignment.id, authorId, { title: 'Edited title', brief: 'Edited brief', spec })).toMatchObject({ ok: true });
		await saveDraft(original.id, authorId, draft('Edited in the browser.', original.title));
		await seedDemo(db);
		const row = await db.query.lessons.findFirst({ where: eq(lessons.id, original.id) });
		expect(row).toMatchObject({ source: 'db', minutes: 13 });
		expect((await listVersions(original.id))!.versions[0].body).toBe('Edited in the browser.');
		const after = await db.query.assignments.findFirst({ where: eq(assignments.id, assignment.id) });
		expect(after).toMatchObject({ title: 'Edited title', spec: { frames: ['ambient', 'lit'], criteria: [{ kind: 'subject-lift', minStops: 2 }] } });
	});

	test('an invalid assignment spec stores nothing and says where the problem is', async () => {
		const assignment = (await db.query.assignments.findFirst({ where: eq(assignments.lessonId, original.id) }))!;
		const before = assignment.spec;
		const result = await saveAssignment(assignment.id, authorId, {
			title: 'x',
			brief: 'y',
			spec: JSON.stringify({ frames: ['lit'], criteria: [{ kind: 'subject-lift', minStops: 1 }, { kind: 'ambient-under', stops: 'two' }] })
		});
		expect(result).toMatchObject({ ok: false, specErrors: expect.arrayContaining([{ path: 'criteria[1].stops', message: 'must be a number' }]) });
		expect((await db.query.assignments.findFirst({ where: eq(assignments.id, assignment.id) }))!.spec).toEqual(before);
	});
});

describe('lesson completion', () => {
	afterAll(removeFreshPeople);

	test('"I\'ve finished this lesson" and its undo, for a signed-in learner on an open lesson', async () => {
		const cookies = await signedInCookies((await freshLearner()).email);
		const params = { course: COURSE, lesson: 'guide-numbers' };
		const act = (done: string) =>
			throughHooks(makeEvent({ path: `/courses/${COURSE}/guide-numbers?/complete`, cookies, params, form: { done } }), (e) => lessonActions.complete(e as never));
		const read = async () =>
			valueOf<{ progress: unknown }>(await throughHooks(makeEvent({ path: `/courses/${COURSE}/guide-numbers`, cookies, params }), (e) => lessonLoad(e as never))).progress;
		expect(await read()).toEqual({ completed: false });
		expect(await act('yes')).toEqual({ kind: 'value', value: { completed: true } });
		expect(await read()).toEqual({ completed: true });
		expect(await act('no')).toEqual({ kind: 'value', value: { completed: false } });
		expect(await read()).toEqual({ completed: false });
		const anonymous = await throughHooks(makeEvent({ path: `/courses/${COURSE}/guide-numbers?/complete`, params, form: { done: 'yes' } }), (e) => lessonActions.complete(e as never));
		expect(anonymous).toMatchObject({ kind: 'redirect', status: 303 });
	});
});

// The author's forms (superforms + zod): a bad form answers 400 with the message beside its field, keeps what was
// typed and stores nothing; a good one is stored; a second identical submit does not make a second lesson.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { eq, like } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { assignments, lessonVersions, lessons } from '$lib/server/db/schema';
import { actions as newLessonActions } from '../../src/routes/(author)/author/lessons/new/+page.server';
import { actions as editorActions } from '../../src/routes/(author)/author/lessons/[id=integer]/+page.server';
import { actions as newAssignmentActions } from '../../src/routes/(author)/author/lessons/[id=integer]/assignments/new/+page.server';
import { actions as assignmentActions } from '../../src/routes/(author)/author/assignments/[id=integer]/+page.server';
import { demoAccount, signedInCookies } from './support/people';
import { failureOf, makeEvent, throughHooks, type Outcome, type TestCookies } from './support/request-event';
import { moduleIdOf } from './support/course';

const COURSE = 'daylight-flash-for-action';
const prefix = `t-forms-${Date.now().toString(36)}`;
let moduleId: number;
let author: TestCookies;

type FormResult = { form: { valid: boolean; data: Record<string, unknown>; errors: Record<string, string[] | undefined>; message?: unknown } };

beforeAll(async () => {
	author = await signedInCookies(demoAccount('author').email);
	moduleId = await moduleIdOf(COURSE);
});

afterAll(async () => {
	await db.delete(assignments).where(like(assignments.slug, `${prefix}%`));
	await db.delete(lessons).where(like(lessons.slug, `${prefix}%`));
});

function createLesson(form: Record<string, string>, cookies = author) {
	const event = makeEvent({ path: '/author/lessons/new', form, cookies });
	return throughHooks(event, (e) => newLessonActions.default(e as never));
}

function saveSettings(lessonId: number, form: Record<string, string>) {
	const event = makeEvent({ path: `/author/lessons/${lessonId}?/settings`, form, cookies: author, params: { id: String(lessonId) } });
	return throughHooks(event, (e) => editorActions.settings(e as never));
}

const failed = (outcome: Outcome<unknown>) => failureOf((outcome as { value: unknown }).value) as { status: number; data: FormResult } | null;
const lessonsNamed = (slug: string) => db.select().from(lessons).where(eq(lessons.slug, slug));

describe('new lesson form', () => {
	test('a bad form names each wrong field, keeps what was typed and stores nothing', async () => {
		const slug = `${prefix}-Bad Slug`;
		const outcome = failed(await createLesson({ moduleId: String(moduleId), title: '', slug, summary: 'Kept summary', minutes: '0' }));
		expect(outcome?.status).toBe(400);
		expect(outcome?.data.form.errors).toMatchObject({
			title: ['Give it a title.'],
			slug: [expect.stringMatching(/^Use lower-case letters/)],
			minutes: ['At least 1 minute.']
		});
		expect(outcome?.data.form.data).toMatchObject({ summary: 'Kept summary', minutes: 0, moduleId });
		expect(await db.select().from(lessons).where(like(lessons.slug, `${prefix}%`))).toEqual([]);
	});

	test('text where a number belongs is a field message, not a crash', async () => {
		const outcome = failed(await createLesson({ moduleId: 'abc', title: 'T', slug: `${prefix}-nan`, summary: '', minutes: 'ten' }));
		expect(outcome?.status).toBe(400);
		expect(outcome?.data.form.errors).toMatchObject({ moduleId: ['Choose a module.'], minutes: [expect.any(String)] });
		const outside = failed(await createLesson({ moduleId: '99999999999', title: 'T', slug: `${prefix}-big`, summary: '', minutes: '5' }));
		expect(outside?.data.form.errors).toMatchObject({ moduleId: ['Choose a module.'] });
		const gone = failed(await createLesson({ moduleId: '999999', title: 'T', slug: `${prefix}-gone`, summary: '', minutes: '5' }));
		expect(gone?.status).toBe(400);
		expect(gone?.data.form.errors).toMatchObject({ moduleId: ['That module no longer exists.'] });
	});

	test('a good form makes one lesson (open when ticked); the same form again is refused on its slug', async () => {
		const slug = `${prefix}-dock`;
		const form = { moduleId: String(moduleId), title: 'Reach at the dock', slug, summary: 'Close light.', minutes: '7', freePreview: 'on' };
		const made = await createLesson(form);
		expect(made).toMatchObject({ kind: 'redirect', status: 303, location: expect.stringMatching(/^\/author\/lessons\/\d+\?notice=created$/) });
		const [row] = await lessonsNamed(slug);
		expect(row).toMatchObject({ title: 'Reach at the dock', minutes: 7, freePreview: true, published: false, moduleId });
		const again = failed(await createLesson(form));
		expect(again?.data.form.errors).toMatchObject({ slug: ['Another lesson in this course has that slug.'] });
		expect(await lessonsNamed(slug)).toHaveLength(1);
	});

	test('only an author may use it', async () => {
		const learner = await signedInCookies(demoAccount('learner').email);
		const slug = `${prefix}-learner`;
		const outcome = await createLesson({ moduleId: String(moduleId), title: 'Not mine', slug, summary: '', minutes: '5' }, learner);
		expect(outcome).toMatchObject({ kind: 'error', status: 403 });
		expect(await lessonsNamed(slug)).toEqual([]);
	});
});

describe('lesson settings form', () => {
	test('bad minutes are named and change nothing; good ones apply, an unticked box switches the open lesson off', async () => {
		const slug = `${prefix}-settings`;
		await createLesson({ moduleId: String(moduleId), title: 'Settings', slug, summary: '', minutes: '10', freePreview: 'on' });
		const [row] = await lessonsNamed(slug);

		const bad = failed(await saveSettings(row.id, { minutes: '999', freePreview: 'on' }));
		expect(bad?.status).toBe(400);
		expect(bad?.data.form.errors).toMatchObject({ minutes: ['At most 240 minutes.'], _errors: ['Settings not saved.'] });
		expect(bad?.data.form.data).toMatchObject({ minutes: 999, freePreview: true });
		expect((await lessonsNamed(slug))[0]).toMatchObject({ minutes: 10, freePreview: true });

		const good = await saveSettings(row.id, { minutes: '12' });
		expect(good).toMatchObject({ kind: 'value', value: { form: { valid: true, message: expect.any(String) } } });
		expect((await lessonsNamed(slug))[0]).toMatchObject({ minutes: 12, freePreview: false });
	});
});

describe('assignment forms', () => {
	const VALID_SPEC = JSON.stringify({ frames: ['reference', 'lit'], criteria: [{ kind: 'ambient-under', stops: 1.5 }] });
	// one criterion asks for more underexposure than the checker allows (at most 6 stops)
	const BAD_SPEC = JSON.stringify({ frames: ['reference', 'lit'], criteria: [{ kind: 'ambient-under', stops: 9 }] });
	type Notice = { ok: boolean; text: string; specErrors?: { path: string; message: string }[] };
	let lessonId: number;

	beforeAll(async () => {
		await createLesson({ moduleId: String(moduleId), title: 'Assignments here', slug: `${prefix}-assign`, summary: '', minutes: '5' });
		lessonId = (await lessonsNamed(`${prefix}-assign`))[0].id;
	});

	function newAssignment(form: Record<string, string>) {
		const event = makeEvent({ path: `/author/lessons/${lessonId}/assignments/new`, form, cookies: author, params: { id: String(lessonId) } });
		return throughHooks(event, (e) => newAssignmentActions.default(e as never));
	}
	function saveAssignment(id: number, form: Record<string, string>) {
		const event = makeEvent({ path: `/author/assignments/${id}`, form, cookies: author, params: { id: String(id) } });
		return throughHooks(event, (e) => assignmentActions.default(e as never));
	}
	const assignmentsNamed = (slug: string) => db.select().from(assignments).where(eq(assignments.slug, slug));

	test('a new one with wrong fields names them, keeps the text and stores nothing', async () => {
		const outcome = failed(await newAssignment({ slug: 'Not A Slug', title: '', brief: 'Kept brief', spec: VALID_SPEC }));
		expect(outcome?.status).toBe(400);
		expect(outcome?.data.form.errors).toMatchObject({ slug: [expect.stringMatching(/^Use lower-case/)], title: ['Give it a title.'] });
		expect(outcome?.data.form.data).toMatchObject({ brief: 'Kept brief', spec: VALID_SPEC });
		expect(outcome?.data.form.message).toMatchObject({ ok: false, text: 'Nothing was saved: check the fields marked.' });
		expect(await db.select().from(assignments).where(like(assignments.slug, `${prefix}%`))).toEqual([]);
	});

	test('a spec with a problem says where it is and stores nothing; a good one is made once', async () => {
		const slug = `${prefix}-freeze`;
		const bad = failed(await newAssignment({ slug, title: 'Freeze', brief: 'Shoot it.', spec: BAD_SPEC }));
		expect(bad?.status).toBe(400);
		expect(bad?.data.form.message as Notice).toMatchObject({ ok: false, specErrors: [expect.objectContaining({ path: expect.stringContaining('criteria') })] });
		expect(bad?.data.form.data).toMatchObject({ spec: BAD_SPEC });
		expect(await assignmentsNamed(slug)).toEqual([]);

		const made = await newAssignment({ slug, title: 'Freeze', brief: 'Shoot it.', spec: VALID_SPEC });
		expect(made).toMatchObject({ kind: 'redirect', status: 303, location: expect.stringMatching(/^\/author\/assignments\/\d+\?notice=created$/) });
		const again = failed(await newAssignment({ slug, title: 'Freeze', brief: 'Shoot it.', spec: VALID_SPEC }));
		expect(again?.data.form.errors).toMatchObject({ slug: ['Another assignment already has that slug.'] });
		expect(await assignmentsNamed(slug)).toHaveLength(1);
	});

	test('editing: a bad spec changes nothing; a good edit is saved with a message', async () => {
		const [row] = await assignmentsNamed(`${prefix}-freeze`);
		const bad = failed(await saveAssignment(row.id, { title: 'Changed', brief: 'Changed brief', spec: BAD_SPEC }));
		expect(bad?.status).toBe(400);
		expect(bad?.data.form.data).toMatchObject({ title: 'Changed', brief: 'Changed brief' });
		expect((await assignmentsNamed(`${prefix}-freeze`))[0]).toMatchObject({ title: 'Freeze', brief: 'Shoot it.' });

		const empty = failed(await saveAssignment(row.id, { title: 'Changed', brief: '', spec: VALID_SPEC }));
		expect(empty?.data.form.errors).toMatchObject({ brief: ['Write a brief: what to shoot and why.'] });

		const good = await saveAssignment(row.id, { title: 'Freeze the rower', brief: 'Shoot it fast.', spec: VALID_SPEC });
		expect(good).toMatchObject({ kind: 'value', value: { form: { valid: true, message: { ok: true, text: expect.stringMatching(/^Assignment saved/) } } } });
		expect((await assignmentsNamed(`${prefix}-freeze`))[0]).toMatchObject({ title: 'Freeze the rower', brief: 'Shoot it fast.' });
	});
});

describe('lesson draft form', () => {
	let lessonId: number;
	beforeAll(async () => {
		await createLesson({ moduleId: String(moduleId), title: 'Draft here', slug: `${prefix}-draft`, summary: '', minutes: '5' });
		lessonId = (await lessonsNamed(`${prefix}-draft`))[0].id;
	});
	function editor(name: 'save' | 'publish', form: Record<string, string>) {
		const event = makeEvent({ path: `/author/lessons/${lessonId}?/${name}`, form, cookies: author, params: { id: String(lessonId) } });
		return throughHooks(event, (e) => editorActions[name](e as never));
	}

	test('saving names a missing title, keeps the text typed, and adds no version', async () => {
		const versions = () => db.select().from(lessonVersions).where(eq(lessonVersions.lessonId, lessonId));
		const before = (await versions()).length;
		const outcome = failed(await editor('save', { title: ' ', summary: 'S', body: 'Typed words.', note: 'why' }));
		expect(outcome?.status).toBe(400);
		expect(outcome?.data.form.errors).toMatchObject({ title: ['Give it a title.'] });
		expect(outcome?.data.form.data).toMatchObject({ body: 'Typed words.', note: 'why' });
		expect(outcome?.data.form.message).toMatchObject({ ok: false, text: 'Nothing was saved: check the fields marked.' });
		expect(await versions()).toHaveLength(before);
	});

	test('a saved draft answers with its message and clears the note; publishing text with a problem lists it', async () => {
		const saved = await editor('save', { title: 'Draft here', summary: '', body: 'Close light at the dock.', note: 'first words' });
		expect(saved).toMatchObject({ kind: 'value', value: { form: { valid: true, message: { ok: true }, data: { note: '', body: 'Close light at the dock.' } } } });
		const refused = failed(await editor('publish', { title: 'Draft here', summary: '', body: 'Words.\n\n<NoSuchWidget />\n', note: '' }));
		expect(refused?.status).toBe(400);
		expect(refused?.data.form.message).toMatchObject({ ok: false, problems: [expect.any(String)] });
		expect((await lessonsNamed(`${prefix}-draft`))[0].published).toBe(false);
	});
});

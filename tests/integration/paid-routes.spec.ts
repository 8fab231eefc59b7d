// Every paid route refuses a learner who has not enrolled: members-only lesson pages (and their actions), and every
// API route whose path names attempts or uploads. Open lessons stay open to everyone, signed in or not.
import { randomBytes } from 'node:crypto';
import { and, asc, eq } from 'drizzle-orm';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { db } from '$lib/server/db';
import { assignments, courses, enrolments, lessons, modules } from '$lib/server/db/schema';
import { activateEnrolment } from '$lib/server/payments/enrolments';
import * as learnLayout from '../../src/routes/(learn)/+layout.server';
import * as lessonPage from '../../src/routes/(learn)/courses/[course]/[lesson]/+page.server';
import { failureOf, makeEvent, throughHooks, type Outcome, type TestCookies } from './support/request-event';
import { demoAccount, freshLearner, removeFreshPeople, signedInCookies } from './support/people';
import { httpMethods, listApiRoutes } from './support/api-routes';

type LessonRow = { course: string; courseId: number; lesson: string; title: string; freePreview: boolean };
let allLessons: LessonRow[] = [];
let paid: LessonRow[] = [];
let previews: LessonRow[] = [];
let learner: { id: string; email: string; cookies: TestCookies };

beforeAll(async () => {
	allLessons = await db
		.select({ course: courses.slug, courseId: courses.id, lesson: lessons.slug, title: lessons.title, freePreview: lessons.freePreview })
		.from(lessons)
		.innerJoin(modules, eq(lessons.moduleId, modules.id))
		.innerJoin(courses, eq(modules.courseId, courses.id))
		.where(and(eq(lessons.published, true), eq(courses.published, true)))
		.orderBy(asc(courses.slug), asc(modules.position), asc(lessons.position));
	paid = allLessons.filter((l) => !l.freePreview);
	previews = allLessons.filter((l) => l.freePreview);
	const made = await freshLearner();
	learner = { ...made, cookies: await signedInCookies(made.email) };
});
afterAll(removeFreshPeople);

const lessonPath = (l: LessonRow) => `/courses/${l.course}/${l.lesson}`;

/** The page as the app serves it: the (learn) layout guard first, then the page's own load. */
async function openLesson(l: LessonRow, cookies: TestCookies | undefined): Promise<Outcome<unknown>> {
	const event = () => makeEvent({ path: lessonPath(l), cookies, params: { course: l.course, lesson: l.lesson } });
	const layout = await throughHooks(event(), (e) => learnLayout.load(e as never));
	if (layout.kind !== 'value') return layout;
	return throughHooks(event(), (e) => lessonPage.load(e as never));
}

describe('lesson pages', () => {
	test('the demo has members-only lessons and open lessons to check (guards the walk itself)', () => {
		expect(paid.length).toBeGreaterThanOrEqual(10);
		expect(previews.map((l) => l.lesson)).toContain('what-a-stop-is');
	});

	test('every members-only lesson sends a non-enrolled learner to the enrol offer, with nothing of the lesson', async () => {
		for (const l of paid) {
			const outcome = await openLesson(l, learner.cookies);
			expect(outcome, lessonPath(l)).toEqual({ kind: 'redirect', status: 303, location: `/courses/${l.course}?locked=${l.lesson}` });
		}
	});

	test('every members-only lesson sends an anonymous visitor to sign in and back', async () => {
		for (const l of paid) {
			const outcome = await openLesson(l, undefined);
			expect(outcome, lessonPath(l)).toEqual({ kind: 'redirect', status: 303, location: `/signin?redirectTo=${encodeURIComponent(lessonPath(l))}` });
		}
	});

	test('open lessons open signed out and for a non-enrolled learner', async () => {
		for (const l of previews) {
			for (const cookies of [undefined, learner.cookies]) {
				const outcome = await openLesson(l, cookies);
				expect(outcome.kind, lessonPath(l)).toBe('value');
				expect((outcome as { value: { lesson: { slug: string } } }).value.lesson.slug).toBe(l.lesson);
			}
		}
	});

	test('enrolment opens every lesson; revoking it closes them again; staff open them without enrolling', async () => {
		const courseIds = [...new Set(paid.map((l) => l.courseId))];
		for (const courseId of courseIds) await activateEnrolment(db, { userId: learner.id, courseId, source: 'admin', paymentId: null });
		for (const l of paid) expect((await openLesson(l, learner.cookies)).kind, lessonPath(l)).toBe('value');
		await db.update(enrolments).set({ status: 'revoked' }).where(eq(enrolments.userId, learner.id));
		for (const l of paid) expect((await openLesson(l, learner.cookies)).kind, lessonPath(l)).toBe('redirect');
		const mentor = await signedInCookies(demoAccount('mentor').email);
		expect((await openLesson(paid[0], mentor)).kind).toBe('value');
		await db.delete(enrolments).where(eq(enrolments.userId, learner.id));
	});

	test('every form action of the lesson page refuses a non-enrolled learner on a members-only lesson', async () => {
		const actions = Object.entries((lessonPage as { actions?: Record<string, (e: unknown) => unknown> }).actions ?? {});
		// guards the walk: the page has actions (I've finished this lesson) today; a page without any has nothing to refuse
		expect(actions.length).toBeGreaterThan(0);
		for (const [name, action] of actions) {
			for (const l of paid.slice(0, 3)) {
				const event = makeEvent({ path: `${lessonPath(l)}?/${name}`, form: { lesson: l.lesson }, cookies: learner.cookies, params: { course: l.course, lesson: l.lesson } });
				const outcome = await throughHooks(event, (e) => action(e));
				expect(refused(outcome), `action ${name} on ${lessonPath(l)}: ${JSON.stringify(outcome)}`).toBe(true);
			}
		}
	});
});

/** Refused: an error page (403/404), a redirect to the enrol offer or sign-in, or a fail(403/404) result. */
function refused(outcome: Outcome<unknown>): boolean {
	if (outcome.kind === 'error') return outcome.status === 403 || outcome.status === 404;
	if (outcome.kind === 'redirect') return /\?locked=|^\/signin/.test(outcome.location);
	const failure = failureOf(outcome.value);
	return failure !== null && (failure.status === 403 || failure.status === 404);
}

// ---- API routes whose path names attempts or uploads ----

const paidApiRoutes = listApiRoutes().filter(({ parts }) => parts.some((p) => /attempts|uploads/.test(p)));

/** A small real JPEG, so an upload route cannot refuse it for being no photo before it checks enrolment. */
async function tinyJpeg(): Promise<File> {
	const bytes = await sharp({ create: { width: 16, height: 16, channels: 3, background: { r: 120, g: 120, b: 120 } } }).jpeg().toBuffer();
	return new File([new Uint8Array(bytes)], 'lit.jpg', { type: 'image/jpeg' });
}

describe('API routes for attempts and uploads', () => {
	test('the walk finds the upload route (guards the walk itself)', () => {
		expect(paidApiRoutes.map((r) => r.id)).toEqual(expect.arrayContaining(['/api/v1/attempts', '/api/v1/uploads', '/api/v1/uploads/[id]', '/api/v1/attempts/from-uploads']));
	});

	for (const route of paidApiRoutes) {
		const id = route.id;
		test(`${id}: every method refuses a non-enrolled learner`, async () => {
			const [assignment] = await db
				.select({ slug: assignments.slug, id: assignments.id })
				.from(assignments)
				.innerJoin(lessons, eq(assignments.lessonId, lessons.id))
				.where(eq(lessons.freePreview, false))
				.limit(1);
			expect(assignment, 'a members-only assignment to upload to').toBeTruthy();
			const params: Record<string, string> = {};
			const path = route.parts
				.map((p) => {
					const name = /^\[\.{0,3}(\w+)(?:=\w+)?\]$/.exec(p)?.[1];
					if (!name) return p;
					params[name] = /assignment/i.test(name) ? assignment.slug : `missing-${randomBytes(4).toString('hex')}`;
					return params[name];
				})
				.join('/');
			const mod: Record<string, unknown> = await import(/* @vite-ignore */ route.file);
			const exported = httpMethods.filter((m) => typeof mod[m] === 'function');
			expect(exported.length, `${id} exports a handler`).toBeGreaterThan(0);
			for (const method of exported) {
				const form = new FormData();
				form.set('assignment', assignment.slug);
				form.set('assignmentId', String(assignment.id));
				form.set('submissionKey', randomBytes(12).toString('hex'));
				form.append('frame:lit', await tinyJpeg());
				const url = new URL(`/api/${path}`, 'http://localhost:4173');
				const event = makeEvent({ method, path: url.pathname, cookies: learner.cookies, params, routeId: id });
				// the resumable upload speaks tus: its metadata, not a form, names the assignment
				const tus = id.startsWith('/api/v1/uploads')
					? {
							'tus-resumable': '1.0.0',
							'upload-length': '1000',
							'upload-offset': '0',
							'content-type': 'application/offset+octet-stream',
							'upload-metadata': `assignment ${Buffer.from(assignment.slug).toString('base64')},frame ${Buffer.from('lit').toString('base64')},submissionKey ${Buffer.from(randomBytes(12).toString('hex')).toString('base64')}`
						}
					: null;
				const withBody =
					method === 'GET' || method === 'DELETE' || method === 'HEAD'
						? { ...event, request: new Request(url, { method, headers: { origin: url.origin, ...tus } }) }
						: tus
							? { ...event, request: new Request(url, { method, body: method === 'PATCH' ? new Uint8Array(1000) : null, headers: { origin: url.origin, ...tus } }) }
							: { ...event, request: new Request(url, { method, body: form, headers: { origin: url.origin } }) };
				const outcome = await throughHooks(withBody as never, (e) => (mod[method] as (e: unknown) => Response | Promise<Response>)(e));
				const status = outcome.kind === 'value' ? (outcome.value as Response).status : outcome.kind === 'error' ? outcome.status : 0;
				expect([403, 404], `${method} ${id} as a non-enrolled learner answered ${status}`).toContain(status);
				if (outcome.kind === 'value' && status === 403) {
					expect(await (outcome.value as Response).clone().json()).toMatchObject({ error: expect.stringMatching(/not-enrolled|forbidden/) });
				}
			}
		});
	}
});

describe('other paid API routes', () => {
	test('POST /api/v1/quiz-answers refuses an answer to a members-only lesson from a non-enrolled learner', async () => {
		const { POST } = await import('../../src/routes/api/v1/quiz-answers/+server');
		const l = paid[0];
		const url = new URL('/api/v1/quiz-answers', 'http://localhost:4173');
		const event = makeEvent({ method: 'POST', path: url.pathname, cookies: learner.cookies });
		const body = JSON.stringify({ lessonPath: lessonPath(l), quizId: 'q1', answer: 1, correct: true });
		const withBody = { ...event, request: new Request(url, { method: 'POST', body, headers: { origin: url.origin, 'content-type': 'application/json' } }) };
		const outcome = await throughHooks(withBody as never, (e) => POST(e as never));
		const response = (outcome as { value: Response }).value;
		expect(response.status).toBe(403);
		expect(await response.json()).toMatchObject({ error: 'not-enrolled' });
	});
});

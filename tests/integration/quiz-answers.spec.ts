// POST /api/v1/quiz-answers: who may store answers, what a bad request gets, the server's own verdict, upserts, paid access and completion.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { courses, enrolments, lessonProgress, lessons, quizAnswers } from '$lib/server/db/schema';
import { POST } from '../../src/routes/api/v1/quiz-answers/+server';
import { load as lessonLoad } from '../../src/routes/(learn)/courses/[course]/[lesson]/+page.server';
import { makeEvent, throughHooks, valueOf, type TestCookies } from './support/request-event';
import { freshLearner, removeFreshPeople, signedInCookies } from './support/people';

const COURSE = 'daylight-flash-for-action';
const PREVIEW = `/courses/${COURSE}/guide-numbers`; // open lesson, quizzes gn-1 and gn-2
const MEMBERS = `/courses/${COURSE}/inverse-square`; // members only, quizzes isq-1, isq-2, isq-3

async function post(body: unknown, cookies?: TestCookies, raw = false) {
	const event = makeEvent({ path: '/api/v1/quiz-answers', cookies, ...(raw ? { rawBody: String(body) } : { json: body }) });
	const response = valueOf<Response>(await throughHooks(event, (e) => POST(e as never)));
	return { status: response.status, body: await response.json() };
}

async function lessonIdOf(slug: string): Promise<number> {
	const row = await db.query.lessons.findFirst({ where: eq(lessons.slug, slug) });
	return row!.id;
}

let learner: { id: string; cookies: TestCookies };

beforeAll(async () => {
	const person = await freshLearner();
	learner = { id: person.id, cookies: await signedInCookies(person.email) };
});

afterAll(async () => {
	// the learner's answers, progress and enrolment go with them
	await removeFreshPeople();
});

describe('POST /api/v1/quiz-answers', () => {
	test('signed out: 401 JSON, nothing stored', async () => {
		const res = await post({ lessonPath: PREVIEW, quizId: 'gn-1', answer: 24, correct: true });
		expect(res).toEqual({ status: 401, body: { error: 'unauthenticated', message: 'Sign in first.' } });
	});

	test('malformed JSON and wrong shapes are 400 with a message saying what is wrong', async () => {
		expect((await post('{not json', learner.cookies, true)).status).toBe(400);
		const cases: [unknown, RegExp][] = [
			[{ quizId: 'gn-1', answer: 24, correct: true }, /lessonPath/],
			[{ lessonPath: '/admin/people', quizId: 'gn-1', answer: 24, correct: true }, /lessonPath must be a lesson address/],
			[{ lessonPath: PREVIEW, quizId: '', answer: 24, correct: true }, /quizId/],
			[{ lessonPath: PREVIEW, quizId: 'gn-1', answer: 24, correct: 'yes' }, /correct/],
			[{ lessonPath: PREVIEW, quizId: 'gn-1', answer: { $gt: 1 }, correct: true }, /answer/],
			[[1, 2, 3], /body|expected/i]
		];
		for (const [body, message] of cases) {
			const res = await post(body, learner.cookies);
			expect(res.status, JSON.stringify(body)).toBe(400);
			expect(res.body.error).toBe('bad-request');
			expect(res.body.message).toMatch(message);
		}
		const stored = await db.select().from(quizAnswers).where(eq(quizAnswers.userId, learner.id));
		expect(stored).toEqual([]);
	});

	test('an unknown lesson or a quiz the lesson does not have is 404', async () => {
		const noLesson = await post({ lessonPath: `/courses/${COURSE}/no-such-lesson`, quizId: 'x', answer: 1, correct: true }, learner.cookies);
		expect(noLesson).toMatchObject({ status: 404, body: { error: 'not-found' } });
		const noQuiz = await post({ lessonPath: PREVIEW, quizId: 'made-up', answer: 1, correct: true }, learner.cookies);
		expect(noQuiz).toMatchObject({ status: 404, body: { message: 'This lesson has no quiz "made-up".' } });
	});

	test('stores an answer to a free-preview lesson and replaces it with the next one (one row per quiz)', async () => {
		const first = await post({ lessonPath: PREVIEW, quizId: 'gn-1', answer: 20 }, learner.cookies);
		expect(first).toEqual({ status: 200, body: { saved: true, quizId: 'gn-1', answer: '20', correct: false, lessonComplete: false } });
		const second = await post({ lessonPath: `${PREVIEW}/`, quizId: 'gn-1', answer: '24' }, learner.cookies);
		expect(second.status).toBe(200);
		const rows = await db.select().from(quizAnswers).where(and(eq(quizAnswers.userId, learner.id), eq(quizAnswers.quizId, 'gn-1')));
		expect(rows.map((r) => ({ answer: r.answer, correct: r.correct, lessonId: r.lessonId }))).toEqual([
			{ answer: '24', correct: true, lessonId: await lessonIdOf('guide-numbers') }
		]);
	});

	test('a forged verdict is ignored: a wrong answer sent with correct=true is stored as wrong and completes nothing', async () => {
		// gn-2 in the lesson file: GN 48 at 4 m needs f/12 (GN = distance × f-number), tolerance 0.5; 16 is wrong
		const forged = await post({ lessonPath: PREVIEW, quizId: 'gn-2', answer: 16, correct: true }, learner.cookies);
		expect(forged).toEqual({ status: 200, body: { saved: true, quizId: 'gn-2', answer: '16', correct: false, lessonComplete: false } });
		const [row] = await db.select().from(quizAnswers).where(and(eq(quizAnswers.userId, learner.id), eq(quizAnswers.quizId, 'gn-2')));
		expect(row.correct).toBe(false);
		const progress = await db.query.lessonProgress.findFirst({
			where: and(eq(lessonProgress.userId, learner.id), eq(lessonProgress.lessonId, await lessonIdOf('guide-numbers')))
		});
		expect(progress?.completedAt ?? null).toBeNull();
		// and a right answer sent with correct=false is still right
		const modest = await post({ lessonPath: PREVIEW, quizId: 'gn-1', answer: 24, correct: false }, learner.cookies);
		expect(modest.body.correct).toBe(true);
	});

	test('completes the lesson once every quiz in it is answered right', async () => {
		const res = await post({ lessonPath: PREVIEW, quizId: 'gn-2', answer: 12 }, learner.cookies);
		expect(res.body.lessonComplete).toBe(true);
		const progress = await db.query.lessonProgress.findFirst({
			where: and(eq(lessonProgress.userId, learner.id), eq(lessonProgress.lessonId, await lessonIdOf('guide-numbers')))
		});
		expect(progress?.completedAt).toBeInstanceOf(Date);
	});

	test('the lesson page gives the learner their saved answers, keyed by quiz id', async () => {
		const event = makeEvent({ path: PREVIEW, cookies: learner.cookies, params: { course: COURSE, lesson: 'guide-numbers' } });
		const data = valueOf<Record<string, unknown>>(await throughHooks(event, (e) => lessonLoad(e as never)));
		expect(data.quizAnswers).toEqual({ 'gn-1': { answer: '24', correct: true }, 'gn-2': { answer: '12', correct: true } });
		expect(data.progress).toEqual({ completed: true });
	});

	test('a members-only lesson needs an enrolment: 403 without, 200 with', async () => {
		const body = { lessonPath: MEMBERS, quizId: 'isq-3', answer: 2 };
		const refused = await post(body, learner.cookies);
		expect(refused).toMatchObject({ status: 403, body: { error: 'not-enrolled' } });

		const course = await db.query.courses.findFirst({ where: eq(courses.slug, COURSE) });
		await db.insert(enrolments).values({ userId: learner.id, courseId: course!.id, source: 'admin' });
		try {
			const allowed = await post(body, learner.cookies);
			expect(allowed).toMatchObject({ status: 200, body: { saved: true, correct: true, lessonComplete: false } });
		} finally {
			await db.delete(enrolments).where(eq(enrolments.userId, learner.id));
		}
	});
});

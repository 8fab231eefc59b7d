// A learner's progress on the course pages: per-module completion and "Continue" with the last lesson opened.
import { afterAll, describe, expect, test } from 'vitest';
import { load as lessonLoad, actions as lessonActions } from '../../src/routes/(learn)/courses/[course]/[lesson]/+page.server';
import { load as courseLoad } from '../../src/routes/(public)/courses/[course]/+page.server';
import { load as catalogueLoad } from '../../src/routes/(public)/courses/+page.server';
import { makeEvent, throughHooks, valueOf, type TestCookies } from './support/request-event';
import { freshLearner, removeFreshPeople, signedInCookies } from './support/people';
import { enrol } from './support/attempts';
import { and, eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { enrolments } from '$lib/server/db/schema';
import { landingPathFor } from '$lib/server/landing';

const COURSE = 'daylight-flash-for-action';

afterAll(removeFreshPeople);

async function open(cookies: TestCookies | undefined, lesson: string) {
	const outcome = await throughHooks(makeEvent({ path: `/courses/${COURSE}/${lesson}`, cookies, params: { course: COURSE, lesson } }), (e) => lessonLoad(e as never));
	expect(outcome.kind).toBe('value');
}

async function coursePage(cookies?: TestCookies) {
	const outcome = await throughHooks(makeEvent({ path: `/courses/${COURSE}`, cookies, params: { course: COURSE } }), (e) => courseLoad(e as never));
	return valueOf<{
		progress: { started: boolean; completed: string[]; resume: { lessonSlug: string; lessonTitle: string } | null } | null;
		firstVisit: boolean;
		guide: { slug: string; frames: string[]; gear: { id: string }[] }[];
	}>(outcome);
}

describe('course progress', () => {
	test('a visitor gets no progress; a new learner gets none done and nothing to continue', async () => {
		expect((await coursePage()).progress).toBeNull();
		const cookies = await signedInCookies((await freshLearner()).email);
		expect((await coursePage(cookies)).progress).toEqual({ started: false, completed: [], resume: null });
	});

	test('opening lessons sets "Continue" to the last one; completing one counts it', async () => {
		const cookies = await signedInCookies((await freshLearner()).email);
		await open(cookies, 'what-a-stop-is');
		await new Promise((r) => setTimeout(r, 20));
		await open(cookies, 'guide-numbers');
		const complete = makeEvent({ path: `/courses/${COURSE}/what-a-stop-is?/complete`, cookies, params: { course: COURSE, lesson: 'what-a-stop-is' }, form: { done: 'yes' } });
		await throughHooks(complete, (e) => lessonActions.complete(e as never));

		const { progress } = await coursePage(cookies);
		expect(progress).toEqual({ started: true, completed: ['what-a-stop-is'], resume: { courseSlug: COURSE, lessonSlug: 'guide-numbers', lessonTitle: 'Guide numbers' } });

		const catalogue = await throughHooks(makeEvent({ path: '/courses', cookies }), (e) => catalogueLoad(e as never));
		expect(valueOf<{ resume: unknown }>(catalogue).resume).toEqual({
			[COURSE]: { courseSlug: COURSE, lessonSlug: 'guide-numbers', lessonTitle: 'Guide numbers' }
		});
	});

	test('visitors get no resume points on the catalogue', async () => {
		const catalogue = await throughHooks(makeEvent({ path: '/courses' }), (e) => catalogueLoad(e as never));
		expect(valueOf<{ resume: unknown }>(catalogue).resume).toEqual({});
	});

	test('a refunded (revoked) learner is offered no Continue into a paid lesson, on either page or at sign-in', async () => {
		const learner = await freshLearner();
		const cookies = await signedInCookies(learner.email);
		expect(await landingPathFor({ id: learner.id, roles: ['learner'] })).toBe('/courses');
		await enrol(learner.id);
		expect(await landingPathFor({ id: learner.id, roles: ['learner'] })).toBe(`/courses/${COURSE}`);
		await open(cookies, 'inverse-square');
		expect((await coursePage(cookies)).progress?.resume?.lessonSlug).toBe('inverse-square');
		expect(await landingPathFor({ id: learner.id, roles: ['learner'] })).toBe(`/courses/${COURSE}/inverse-square`);

		await db.update(enrolments).set({ status: 'revoked', revokedAt: new Date() }).where(and(eq(enrolments.userId, learner.id)));
		const page = await coursePage(cookies);
		expect(page.progress).toMatchObject({ started: true, resume: null });
		const catalogue = await throughHooks(makeEvent({ path: '/courses', cookies }), (e) => catalogueLoad(e as never));
		expect(valueOf<{ resume: unknown }>(catalogue).resume).toEqual({});
		expect(await landingPathFor({ id: learner.id, roles: ['learner'] })).toBe('/courses');
		// staff are never locked out, so their last lesson stays
		expect(await landingPathFor({ id: learner.id, roles: ['learner', 'mentor'] })).toBe('/mentor');
	});
});

describe('the course guide', () => {
	test('opens on a first visit with every Assignment, its frames and its gear, and folds once a lesson was opened', async () => {
		const first = await coursePage();
		expect(first.firstVisit).toBe(true);
		const blue = first.guide.find((a) => a.slug === 'blue-hour-at-noon');
		expect(blue?.frames).toEqual(['reference', 'lit']);
		expect(blue?.gear.map((g) => g.id)).toEqual(expect.arrayContaining(['flash', 'stand', 'trigger', 'gel']));
		expect(first.guide.find((a) => a.slug === 'three-rungs')?.gear.map((g) => g.id)).toEqual(['camera']);
		// briefs are paid text: the guide carries none
		expect(JSON.stringify(first.guide)).not.toContain('brief');

		const cookies = await signedInCookies((await freshLearner()).email);
		expect((await coursePage(cookies)).firstVisit).toBe(true);
		await open(cookies, 'what-a-stop-is');
		expect((await coursePage(cookies)).firstVisit).toBe(false);
	});
});

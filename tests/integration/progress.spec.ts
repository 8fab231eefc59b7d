// A learner's progress on the course pages: per-module completion and "Continue" with the last lesson opened.
import { afterAll, describe, expect, test } from 'vitest';
import { load as lessonLoad, actions as lessonActions } from '../../src/routes/(learn)/courses/[course]/[lesson]/+page.server';
import { load as courseLoad } from '../../src/routes/(public)/courses/[course]/+page.server';
import { load as catalogueLoad } from '../../src/routes/(public)/courses/+page.server';
import { makeEvent, throughHooks, valueOf, type TestCookies } from './support/request-event';
import { freshLearner, removeFreshPeople, signedInCookies } from './support/people';

const COURSE = 'daylight-flash-for-action';

afterAll(removeFreshPeople);

async function open(cookies: TestCookies | undefined, lesson: string) {
	const outcome = await throughHooks(makeEvent({ path: `/courses/${COURSE}/${lesson}`, cookies, params: { course: COURSE, lesson } }), (e) => lessonLoad(e as never));
	expect(outcome.kind).toBe('value');
}

async function coursePage(cookies?: TestCookies) {
	const outcome = await throughHooks(makeEvent({ path: `/courses/${COURSE}`, cookies, params: { course: COURSE } }), (e) => courseLoad(e as never));
	return valueOf<{ progress: { completed: string[]; resume: { lessonSlug: string; lessonTitle: string } | null } | null }>(outcome);
}

describe('course progress', () => {
	test('a visitor gets no progress; a new learner gets none done and nothing to continue', async () => {
		expect((await coursePage()).progress).toBeNull();
		const cookies = await signedInCookies((await freshLearner()).email);
		expect((await coursePage(cookies)).progress).toEqual({ completed: [], resume: null });
	});

	test('opening lessons sets "Continue" to the last one; completing one counts it', async () => {
		const cookies = await signedInCookies((await freshLearner()).email);
		await open(cookies, 'what-a-stop-is');
		await new Promise((r) => setTimeout(r, 20));
		await open(cookies, 'guide-numbers');
		const complete = makeEvent({ path: `/courses/${COURSE}/what-a-stop-is?/complete`, cookies, params: { course: COURSE, lesson: 'what-a-stop-is' }, form: { done: 'yes' } });
		await throughHooks(complete, (e) => lessonActions.complete(e as never));

		const { progress } = await coursePage(cookies);
		expect(progress).toEqual({ completed: ['what-a-stop-is'], resume: { courseSlug: COURSE, lessonSlug: 'guide-numbers', lessonTitle: 'Guide numbers' } });

		const catalogue = await throughHooks(makeEvent({ path: '/courses', cookies }), (e) => catalogueLoad(e as never));
		expect(valueOf<{ resume: unknown }>(catalogue).resume).toEqual({
			[COURSE]: { courseSlug: COURSE, lessonSlug: 'guide-numbers', lessonTitle: 'Guide numbers' }
		});
	});

	test('visitors get no resume points on the catalogue', async () => {
		const catalogue = await throughHooks(makeEvent({ path: '/courses' }), (e) => catalogueLoad(e as never));
		expect(valueOf<{ resume: unknown }>(catalogue).resume).toEqual({});
	});
});

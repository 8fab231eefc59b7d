// Guessing: coupon codes are throttled per learner like sign-in passwords.
import { afterAll, describe, expect, test } from 'vitest';
import { throttleRules } from '$lib/server/throttle';
import * as coursePage from '../../src/routes/(public)/courses/[course]/+page.server';
import { failureOf, makeEvent, throughHooks } from './support/request-event';
import { freshLearner, removeFreshPeople, signedInCookies, testAddress } from './support/people';

afterAll(removeFreshPeople);
const slug = 'daylight-flash-for-action';

async function tryCoupon(cookies: Awaited<ReturnType<typeof signedInCookies>>, coupon: string, address: string) {
	const event = makeEvent({ path: `/courses/${slug}?/enrol`, form: { coupon }, cookies, params: { course: slug }, address });
	const outcome = await throughHooks(event, (e) => coursePage.actions.enrol(e as never));
	return failureOf((outcome as { value: unknown }).value);
}

describe('coupon guessing', () => {
	test('twenty guesses: the first few get "not valid", then every try waits, even the right code', async () => {
		const learner = await freshLearner();
		const cookies = await signedInCookies(learner.email);
		const address = testAddress();
		const answers: number[] = [];
		for (let i = 0; i < 20; i++) answers.push((await tryCoupon(cookies, `GUESS${i}X`, address))!.status);
		const free = throttleRules.coupon.free;
		expect(answers.slice(0, free + 1)).toEqual(Array(free + 1).fill(400));
		expect(answers.slice(free + 1)).toEqual(Array(20 - free - 1).fill(429));
		const right = await tryCoupon(cookies, 'HARBOR20', address);
		expect(right).toMatchObject({ status: 429, data: { enrol: { message: expect.stringMatching(/Too many coupon codes tried/) } } });

		// another learner on another address is not held up by this one
		const other = await freshLearner();
		const fresh = await tryCoupon(await signedInCookies(other.email), 'NOPE1', testAddress());
		expect(fresh?.status).toBe(400);
	});
});

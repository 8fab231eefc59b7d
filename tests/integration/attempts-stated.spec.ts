// What a learner states with an upload: their subject's speed and distance (written into the Attempt's spec) and the Light Plan an Assignment asks for.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { attempts } from '$lib/server/db/schema';
import { grade } from '$lib/server/grading';
import { readFrame } from '$lib/server/analysis';
import { closeQueue, openQueue } from '$lib/server/attempts/queue';
import { POST } from '../../src/routes/api/v1/attempts/+server';
import { throughHooks } from './support/request-event';
import { freshLearner, removeFreshPeople, signedInCookies } from './support/people';
import { attemptIdsOf, enrol, key, multipartEvent, passingPair, removeAttempts, uploadData } from './support/attempts';

type Learner = Awaited<ReturnType<typeof freshLearner>>;
let learner: Learner;
let pair: { reference: Buffer; lit: Buffer };

async function post(data: FormData) {
	const cookies = await signedInCookies(learner.email);
	const outcome = await throughHooks(multipartEvent('/api/v1/attempts', data, cookies), (e) => POST(e as never));
	if (outcome.kind !== 'value') throw new Error(`unexpected ${outcome.kind}`);
	return { status: outcome.value.status, body: await outcome.value.json() };
}

const plan = (lights: number) =>
	JSON.stringify({ camera: { x: 0, y: -3 }, subject: { x: 0, y: 0 }, lights: [{ x: -2, y: -2 }, { x: 2, y: 2 }, { x: 2, y: -2 }].slice(0, lights) });
const blurOf = (spec: unknown) => (spec as { criteria: { kind: string }[] }).criteria.find((c) => c.kind === 'motion-blur');

beforeAll(async () => {
	await openQueue();
	learner = await freshLearner();
	await enrol(learner.id);
	pair = await passingPair();
});

afterAll(async () => {
	await removeAttempts(await attemptIdsOf(learner.id));
	await removeFreshPeople();
	await closeQueue();
});

describe('stated speed and distance', () => {
	test("the learner's speed and distance replace the assignment's in the Attempt's copy of the spec, and grade", async () => {
		const { status, body } = await post(uploadData({ assignment: 'freeze-the-moment', submissionKey: key(), subjectSpeed: '3', subjectDistance: '8,5' }, pair));
		expect(status).toBe(201);
		const row = await db.query.attempts.findFirst({ where: eq(attempts.id, body.id) });
		expect(blurOf(row?.spec)).toEqual({ kind: 'motion-blur', maxPx: 3, speed: 3, distance: 8.5, stated: true });
		const frames = { reference: await readFrame(pair.reference), lit: await readFrame(pair.lit) };
		const blur = grade(row!.spec as never, frames).criteria.find((c) => c.kind === 'motion-blur');
		expect(blur?.message).toMatch(/the 3 m\/s you gave/);
		expect(blur?.message).toMatch(/8\.5 m away/);
	});

	test("left empty, the assignment's own numbers stay", async () => {
		const { status, body } = await post(uploadData({ assignment: 'freeze-the-moment', submissionKey: key(), subjectSpeed: '', subjectDistance: '' }, pair));
		expect(status).toBe(201);
		const row = await db.query.attempts.findFirst({ where: eq(attempts.id, body.id) });
		expect(blurOf(row?.spec)).toEqual({ kind: 'motion-blur', maxPx: 3, speed: 6, distance: 5 });
	});

	test('a speed that is not a number, or out of range, is refused with a plain message and nothing stored', async () => {
		const before = (await attemptIdsOf(learner.id)).length;
		const words = await post(uploadData({ assignment: 'freeze-the-moment', submissionKey: key(), subjectSpeed: 'fast' }, pair));
		expect(words).toMatchObject({ status: 400, body: { message: expect.stringMatching(/speed must be a number from 0.1 to 100 m\/s/) } });
		const far = await post(uploadData({ assignment: 'freeze-the-moment', submissionKey: key(), subjectDistance: '0' }, pair));
		expect(far.status).toBe(400);
		expect((await attemptIdsOf(learner.id)).length).toBe(before);
	});
});

describe('a Light Plan the assignment asks for', () => {
	test('two lights asked: none or one is refused with what to do, two are taken and stored', async () => {
		const before = (await attemptIdsOf(learner.id)).length;
		const none = await post(uploadData({ assignment: 'two-lights', submissionKey: key() }, pair));
		expect(none).toMatchObject({ status: 422, body: { message: expect.stringMatching(/asks for the Light Plan .* place 2 lights/) } });
		const one = await post(uploadData({ assignment: 'two-lights', submissionKey: key(), lightPlan: plan(1) }, pair));
		expect(one).toMatchObject({ status: 422, body: { message: expect.stringMatching(/with 2 lights; yours has 1/) } });
		expect((await attemptIdsOf(learner.id)).length).toBe(before);
		const two = await post(uploadData({ assignment: 'two-lights', submissionKey: key(), lightPlan: plan(2) }, pair));
		expect(two.status).toBe(201);
		const row = await db.query.attempts.findFirst({ where: eq(attempts.id, two.body.id) });
		expect((row?.lightPlan as { lights: unknown[] }).lights).toHaveLength(2);
	});

	test('a mentor-judged assignment goes to a mentor when nothing else failed', async () => {
		// the pair is 1.58 stops under, within two-lights' 1½ ± ½, with the subject relit: only the mentor's judgement is open
		const { status, body } = await post(uploadData({ assignment: 'two-lights', submissionKey: key(), lightPlan: plan(2) }, pair));
		expect(status).toBe(201);
		const row = await db.query.attempts.findFirst({ where: eq(attempts.id, body.id) });
		const frames = { reference: await readFrame(pair.reference), lit: await readFrame(pair.lit) };
		expect(grade(row!.spec as never, frames).verdict).toBe('needs-review');
	});
});

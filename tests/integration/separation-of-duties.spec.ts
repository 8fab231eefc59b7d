// Separation of duties: a mentor (or an admin with the mentor role) who is the learner on an attempt cannot open it
// for review, pin, unpin, score or override it, and the review queue (page and API) leaves it out.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { eq } from 'drizzle-orm';
import { randomUUID } from 'node:crypto';
import { stringify } from 'devalue';
import { db } from '$lib/server/db';
import { attempts, critiques, pins, users, verdictOverrides } from '$lib/server/db/schema';
import { closeQueue, openQueue } from '$lib/server/attempts/queue';
import { actions, load } from '../../src/routes/(mentor)/mentor/attempts/[id]/+page.server';
import { load as queueLoad } from '../../src/routes/(mentor)/mentor/+page.server';
import { GET as queueApi } from '../../src/routes/api/v1/review-queue/+server';
import { failureOf, makeEvent, throughHooks } from './support/request-event';
import { demoAccount, freshLearner, removeFreshPeople, signedInCookies } from './support/people';
import { attemptIdsOf, enrol, gradedAttemptOf, removeAttempts } from './support/attempts';

let self: Awaited<ReturnType<typeof freshLearner>>;
let attemptId: string;

beforeAll(async () => {
	await openQueue();
	// a mentor (and admin) who also takes the course as a learner
	self = await freshLearner();
	await db.update(users).set({ roles: ['learner', 'mentor', 'admin'] }).where(eq(users.id, self.id));
	await enrol(self.id);
	attemptId = await gradedAttemptOf(self.id);
});

afterAll(async () => {
	await removeAttempts(await attemptIdsOf(self.id));
	await removeFreshPeople();
	await closeQueue();
});

async function asSelf(name: keyof typeof actions, form: Record<string, string>) {
	const cookies = await signedInCookies(self.email);
	const event = makeEvent({ path: `/mentor/attempts/${attemptId}?/${name}`, form, cookies, params: { id: attemptId } });
	return throughHooks(event, (e) => (actions[name] as (e: never) => unknown)(e as never));
}

describe('a mentor on their own attempt', () => {
	test('cannot open it for review', async () => {
		const cookies = await signedInCookies(self.email);
		const outcome = await throughHooks(makeEvent({ path: `/mentor/attempts/${attemptId}`, cookies, params: { id: attemptId } }), (e) => load(e as never));
		expect(outcome).toMatchObject({ kind: 'error', status: 403, message: expect.stringMatching(/your own attempt/) });
	});

	test('cannot pin, unpin, score or override it; nothing is stored', async () => {
		const before = await db.query.attempts.findFirst({ where: eq(attempts.id, attemptId) });
		const pin = await asSelf('pin', { __superform_id: 'pin-lit', frame: 'lit', key: randomUUID(), across: '50', down: '50', text: 'Looks great to me' });
		expect(failureOf((pin as { value: unknown }).value)).toMatchObject({ status: 403, data: { form: { message: { text: expect.stringMatching(/your own attempt/), ok: false } } } });

		// a pin another mentor left stays put
		const mentorId = (await db.query.users.findFirst({ where: eq(users.email, demoAccount('mentor').email) }))!.id;
		const [other] = await db.insert(pins).values({ attemptId, frameName: 'lit', number: 1, x: 0.2, y: 0.2, text: 'From another mentor', mentorId }).returning();
		const unpin = await asSelf('unpin', { __superform_id: 'unpin-lit', pin: String(other.id) });
		expect(failureOf((unpin as { value: unknown }).value)).toMatchObject({ status: 403 });
		expect(await db.select().from(pins).where(eq(pins.attemptId, attemptId))).toHaveLength(1);

		const flipped = before!.verdict === 'pass' ? 'fail' : 'pass';
		const review = await asSelf('review', { __superform_id: 'review', __superform_json: stringify({ rubric: {}, text: 'I did well', verdict: flipped, reason: 'I think it passes' }) });
		expect(failureOf((review as { value: unknown }).value)).toMatchObject({ status: 403, data: { form: { message: { text: expect.stringMatching(/your own attempt/) } } } });
		const after = await db.query.attempts.findFirst({ where: eq(attempts.id, attemptId) });
		expect(after).toMatchObject({ verdict: before!.verdict, reviewState: before!.reviewState });
		expect(await db.select().from(critiques).where(eq(critiques.attemptId, attemptId))).toEqual([]);
		expect(await db.select().from(verdictOverrides).where(eq(verdictOverrides.attemptId, attemptId))).toEqual([]);
	});

	test('the queue hides it from them and shows it to another mentor', async () => {
		const ownCookies = await signedInCookies(self.email);
		const otherCookies = await signedInCookies(demoAccount('mentor').email);
		const path = '/api/v1/review-queue?status=all&sort=newest';
		const ids = async (cookies: typeof ownCookies) => {
			const outcome = await throughHooks(makeEvent({ path, cookies }), (e) => queueApi(e as never));
			const body = await (outcome as { value: Response }).value.json();
			return (body.attempts as { id: string }[]).map((a) => a.id);
		};
		expect(await ids(otherCookies)).toContain(attemptId);
		expect(await ids(ownCookies)).not.toContain(attemptId);

		const page = await throughHooks(makeEvent({ path: '/mentor?status=all&sort=newest', cookies: ownCookies }), (e) => queueLoad(e as never));
		const rows = (page as unknown as { value: { attempts: { id: string }[] } }).value.attempts;
		expect(rows.map((r) => r.id)).not.toContain(attemptId);
	});
});

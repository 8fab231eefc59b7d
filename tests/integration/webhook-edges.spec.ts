// Webhook edges: the signed timestamp bounded on both sides, signed but malformed events acknowledged and kept as
// rejected, an unpaid completion that opens nothing, and a body read only up to a small limit.
import { randomBytes } from 'node:crypto';
import { eq, inArray } from 'drizzle-orm';
import Stripe from 'stripe';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { db } from '$lib/server/db';
import { courses, enrolments, payments, webhookEvents } from '$lib/server/db/schema';
import { hasCourseAccess } from '$lib/server/enrolment-access';
import { POST as webhookPost } from '../../src/routes/api/v1/payments/webhook/+server';
import { actions as signInActions } from '../../src/routes/(public)/signin/+page.server';
import { freshLearner, removeFreshPeople, testAddress } from './support/people';
import { pointAppAt, postWebhook, removeTestEvents, signedEvent, testWebhookSecret } from './support/payments';
import { makeEvent, origin, throughHooks } from './support/request-event';

let restoreEnv: () => void;
let courseId: number;
const extraIds: string[] = [];

beforeAll(async () => {
	restoreEnv = pointAppAt(null);
	const course = await db.query.courses.findFirst({ where: eq(courses.slug, 'daylight-flash-for-action') });
	courseId = course!.id;
});
afterAll(async () => {
	restoreEnv?.();
	await removeTestEvents();
	if (extraIds.length) await db.delete(webhookEvents).where(inArray(webhookEvents.id, extraIds));
	await removeFreshPeople();
});

const hex = () => randomBytes(8).toString('hex');

/** Signs any body as the provider would (the helper in support signs only well-formed events). */
function signRaw(body: string, timestamp = Math.floor(Date.now() / 1000)) {
	return Stripe.webhooks.generateTestHeaderString({ payload: body, secret: testWebhookSecret, timestamp });
}

async function pendingCheckout() {
	const learner = await freshLearner();
	const sessionId = `cs_test_${hex()}`;
	const [payment] = await db.insert(payments).values({ userId: learner.id, courseId, checkoutSessionId: sessionId, amountCents: 14900, currency: 'usd' }).returning();
	const session = {
		id: sessionId,
		object: 'checkout.session',
		status: 'complete',
		payment_status: 'paid',
		payment_intent: `pi_${hex()}`,
		amount_total: 14900,
		currency: 'usd',
		client_reference_id: learner.id,
		metadata: { userId: learner.id, courseId: String(courseId) }
	};
	return { learner, payment, session, user: { id: learner.id, roles: ['learner' as const] } };
}

describe('the signed timestamp', () => {
	test('an event signed an hour in the future is refused, one within five minutes is accepted', async () => {
		const { payment, session, user } = await pendingCheckout();
		const now = Math.floor(Date.now() / 1000);
		const future = signedEvent('checkout.session.completed', session, { timestamp: now + 3600 });
		const reply = await postWebhook(future.body, future.header);
		expect(reply).toMatchObject({ status: 400, json: { received: false, error: 'bad-signature' } });
		expect((await db.query.payments.findFirst({ where: eq(payments.id, payment.id) }))!.status).toBe('pending');
		expect(await hasCourseAccess(user, courseId)).toBe(false);

		// a sender's clock a little ahead is normal
		const near = signedEvent('checkout.session.completed', session, { timestamp: now + 120 });
		expect((await postWebhook(near.body, near.header)).status).toBe(200);
		expect(await hasCourseAccess(user, courseId)).toBe(true);
	});
});

describe('signed but malformed events', () => {
	const cases: [string, string][] = [
		['an array', JSON.stringify([{ id: 'evt_x', type: 'checkout.session.completed' }])],
		['data: null', JSON.stringify({ id: `evt_${hex()}`, object: 'event', type: 'checkout.session.completed', data: null })],
		['no id', JSON.stringify({ object: 'event', type: 'charge.refunded', data: { object: { id: 'ch_1' } } })],
		['a charge without its amounts', JSON.stringify({ id: `evt_${hex()}`, object: 'event', type: 'charge.refunded', data: { object: { id: 'ch_1', payment_intent: 'pi_1' } } })],
		['not JSON', 'this is not json'],
		['a NUL inside', JSON.stringify({ id: `evt_${hex()}`, type: 'checkout.session.completed', data: { object: { id: 'cs_\u0000' } } }).replace('cs_', 'cs_')]
	];
	for (const [what, body] of cases) {
		test(`${what}: acknowledged with 2xx and kept as rejected, and a retry changes nothing`, async () => {
			const first = await postWebhook(body, signRaw(body));
			expect(first).toMatchObject({ status: 200, json: { received: true, rejected: true } });
			const again = await postWebhook(body, signRaw(body));
			expect(again.status).toBe(200);
			const rows = await db.select().from(webhookEvents).where(eq(webhookEvents.rejectedReason, String(first.json.message)));
			const mine = rows.filter((r) => (r.id.startsWith('rejected_') || body.includes(r.id)));
			expect(mine).toHaveLength(1);
			expect(mine[0].processedAt).toBeNull();
			extraIds.push(mine[0].id);
		});
	}
});

describe('checkout.session.completed that is not paid', () => {
	test('an unpaid completion (a delayed payment method) opens nothing and leaves the payment pending', async () => {
		const { payment, session, user, learner } = await pendingCheckout();
		const unpaid = signedEvent('checkout.session.completed', { ...session, payment_status: 'unpaid', payment_intent: null });
		expect(await postWebhook(unpaid.body, unpaid.header)).toEqual({ status: 200, json: { received: true } });
		expect((await db.query.payments.findFirst({ where: eq(payments.id, payment.id) }))!.status).toBe('pending');
		expect(await db.select().from(enrolments).where(eq(enrolments.userId, learner.id))).toEqual([]);
		expect(await hasCourseAccess(user, courseId)).toBe(false);
	});
});

/** A body of `total` bytes produced on demand, counting how much of it was ever pulled. */
function countingBody(total: number) {
	const chunk = new Uint8Array(64 * 1024).fill(0x7b);
	const seen = { bytes: 0 };
	const stream = new ReadableStream<Uint8Array>({
		pull(controller) {
			if (seen.bytes >= total) return controller.close();
			seen.bytes += chunk.byteLength;
			controller.enqueue(chunk);
		}
	});
	return { stream, seen };
}

describe('body limits', () => {
	test('a 100 MB body to the webhook is refused with 413 after reading at most a few hundred kilobytes', async () => {
		const { stream, seen } = countingBody(100 * 1024 * 1024);
		const url = new URL('/api/v1/payments/webhook', origin);
		const request = new Request(url, { method: 'POST', body: stream, headers: { 'stripe-signature': 't=1,v1=00' }, duplex: 'half' } as RequestInit);
		const response = await webhookPost({ request, url } as never);
		expect(response.status).toBe(413);
		expect(seen.bytes).toBeLessThan(1024 * 1024);
	});

	test('a declared 100 MB body is refused without reading any of it', async () => {
		const { stream, seen } = countingBody(100 * 1024 * 1024);
		const url = new URL('/api/v1/payments/webhook', origin);
		const headers = { 'stripe-signature': 't=1,v1=00', 'content-length': String(100 * 1024 * 1024) };
		const request = new Request(url, { method: 'POST', body: stream, headers, duplex: 'half' } as RequestInit);
		// undici drops a hand-set content-length from a Request; the route sees what adapter-node would pass on
		Object.defineProperty(request, 'headers', { value: new Headers(headers) });
		expect((await webhookPost({ request, url } as never)).status).toBe(413);
		expect(seen.bytes).toBeLessThanOrEqual(64 * 1024);
	});

	test('a 100 MB sign-in form is refused with 413 at the edge, before the form is parsed', async () => {
		const { stream, seen } = countingBody(100 * 1024 * 1024);
		const event = makeEvent({ path: '/signin', routeId: '/(public)/signin', address: testAddress() });
		const request = new Request(event.url, {
			method: 'POST',
			body: stream,
			headers: { origin, 'content-type': 'application/x-www-form-urlencoded' },
			duplex: 'half'
		} as RequestInit);
		Object.assign(event, { request });
		let reached = false;
		const outcome = await throughHooks(event, (e) => {
			reached = true;
			return signInActions.default(e as never);
		});
		expect(outcome).toMatchObject({ kind: 'error', status: 413 });
		expect(reached).toBe(false);
		expect(seen.bytes).toBeLessThan(4 * 1024 * 1024);
	});
});

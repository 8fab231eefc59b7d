// The payments webhook: signature checked on the raw body, each event stored once, settled idempotently in any order.
import { randomBytes } from 'node:crypto';
import { and, eq, inArray } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { db } from '$lib/server/db';
import { courses, enrolments, payments, webhookEvents } from '$lib/server/db/schema';
import { hasCourseAccess } from '$lib/server/enrolment-access';
import { listMail } from '$lib/server/mailbox';
import { backgroundMailDrained } from '$lib/server/mail';
import { settleRetrievedSession } from '$lib/server/payments/confirm';
import { activateEnrolment } from '$lib/server/payments/enrolments';
import { freshLearner, removeFreshPeople } from './support/people';
import { waitForMail } from './support/mail';
import { pointAppAt, postWebhook, removeTestEvents, signedEvent } from './support/payments';

let restoreEnv: () => void;
let courseId: number;
const price = 14900;

beforeAll(async () => {
	// only the signing secret matters here; no API call is made
	restoreEnv = pointAppAt(null);
	const course = await db.query.courses.findFirst({ where: eq(courses.slug, 'daylight-flash-for-action') });
	if (!course) throw new Error('the demo course is missing: was the demo seeded?');
	courseId = course.id;
});
afterAll(async () => {
	restoreEnv?.();
	await removeTestEvents();
	await removeFreshPeople();
});

const hex = () => randomBytes(8).toString('hex');

/** A learner with a pending payment, as the Enrol action leaves it, plus the provider objects that would follow. */
async function learnerWithCheckout() {
	const learner = await freshLearner();
	const sessionId = `cs_test_${hex()}`;
	const intent = `pi_${hex()}`;
	const [payment] = await db
		.insert(payments)
		.values({ userId: learner.id, courseId, checkoutSessionId: sessionId, amountCents: price, currency: 'usd' })
		.returning();
	const user = { id: learner.id, roles: ['learner' as const] };
	const session = {
		id: sessionId,
		object: 'checkout.session',
		status: 'complete',
		payment_status: 'paid',
		payment_intent: intent,
		amount_total: price,
		currency: 'usd',
		client_reference_id: learner.id,
		metadata: { userId: learner.id, courseId: String(courseId), courseSlug: 'daylight-flash-for-action' }
	};
	const charge = (amountRefunded: number) => ({
		id: `ch_${hex()}`,
		object: 'charge',
		payment_intent: intent,
		amount: price,
		amount_refunded: amountRefunded,
		refunded: amountRefunded === price
	});
	return { learner, user, payment, session, charge, intent };
}

async function enrolmentsOf(userId: string) {
	return db.select().from(enrolments).where(and(eq(enrolments.userId, userId), eq(enrolments.courseId, courseId)));
}
async function paymentRow(id: number) {
	return (await db.query.payments.findFirst({ where: eq(payments.id, id) }))!;
}
async function storedEvents(ids: string[]) {
	return db.select({ id: webhookEvents.id, processedAt: webhookEvents.processedAt }).from(webhookEvents).where(inArray(webhookEvents.id, ids));
}

describe('a completed checkout', () => {
	test('replayed three times and sent again under a new event id gives one enrolment, one receipt', async () => {
		const { learner, user, payment, session } = await learnerWithCheckout();
		const completed = signedEvent('checkout.session.completed', session);
		const first = await postWebhook(completed.body, completed.header);
		expect(first).toEqual({ status: 200, json: { received: true } });
		const paid = await paymentRow(payment.id);
		expect(paid).toMatchObject({ status: 'paid', paymentIntentId: session.payment_intent, amountCents: price });

		for (let i = 0; i < 2; i++) {
			expect(await postWebhook(completed.body, completed.header)).toEqual({ status: 200, json: { received: true, duplicate: true } });
		}
		// the same fact in another event (the provider may send one twice under new ids)
		const again = signedEvent('checkout.session.completed', session);
		expect((await postWebhook(again.body, again.header)).status).toBe(200);

		expect(await storedEvents([completed.id, again.id])).toHaveLength(2);
		const rows = await enrolmentsOf(learner.id);
		expect(rows).toHaveLength(1);
		expect(rows[0]).toMatchObject({ status: 'active', source: 'payment', paymentId: payment.id });
		expect((await paymentRow(payment.id)).paidAt).toEqual(paid.paidAt);
		expect(await hasCourseAccess(user, courseId)).toBe(true);

		const receipt = await waitForMail(learner.email, /Your Stopwise receipt: Daylight Flash for Action/);
		expect(receipt.text).toContain('Paid: $149.00');
		expect(receipt.text).toContain(`Reference: ${session.payment_intent}`);
		expect(receipt.html).toContain('$149.00');
		// every mail sent after an answer has gone: a late duplicate would be in the mailbox now
		await backgroundMailDrained();
		expect((await listMail()).filter((m) => m.to.includes(learner.email) && /receipt/.test(m.subject))).toHaveLength(1);
	});

	test('a completed checkout whose payment is not paid yet (a delayed method) enrols nobody and sends no receipt', async () => {
		const { learner, user, payment, session } = await learnerWithCheckout();
		const unpaid = signedEvent('checkout.session.completed', { ...session, payment_status: 'unpaid' });
		expect(await postWebhook(unpaid.body, unpaid.header)).toMatchObject({ status: 200 });
		expect(await enrolmentsOf(learner.id)).toHaveLength(0);
		expect(await hasCourseAccess(user, courseId)).toBe(false);
		expect((await paymentRow(payment.id)).status).toBe('pending');
		// the success page reading the same session does not enrol either
		await settleRetrievedSession({ ...session, payment_status: 'unpaid' } as never, 'http://localhost:4173');
		expect(await enrolmentsOf(learner.id)).toHaveLength(0);
		await backgroundMailDrained();
		expect((await listMail()).filter((m) => m.to.includes(learner.email))).toHaveLength(0);

		// when the money arrives, the paid session enrols as usual
		const paid = signedEvent('checkout.session.completed', session);
		expect((await postWebhook(paid.body, paid.header)).status).toBe(200);
		expect(await hasCourseAccess(user, courseId)).toBe(true);
	});

	test('five simultaneous deliveries of one event store it once and enrol once', async () => {
		const { learner, payment, session } = await learnerWithCheckout();
		const completed = signedEvent('checkout.session.completed', session);
		const replies = await Promise.all(Array.from({ length: 5 }, () => postWebhook(completed.body, completed.header)));
		expect(replies.map((r) => r.status)).toEqual([200, 200, 200, 200, 200]);
		expect(replies.filter((r) => r.json.duplicate !== true)).toHaveLength(1);
		expect(await enrolmentsOf(learner.id)).toHaveLength(1);
		expect((await paymentRow(payment.id)).status).toBe('paid');
	});

	test('the success page and the webhook settling the same session give one enrolment', async () => {
		const { learner, payment, session } = await learnerWithCheckout();
		const completed = signedEvent('checkout.session.completed', session);
		await Promise.all([postWebhook(completed.body, completed.header), settleRetrievedSession(session as never, 'http://localhost:4173')]);
		await settleRetrievedSession(session as never, 'http://localhost:4173');
		expect(await enrolmentsOf(learner.id)).toHaveLength(1);
		expect((await paymentRow(payment.id)).status).toBe('paid');
	});

	test('a paid session whose payment row is missing is rebuilt from its metadata; unknown people change nothing', async () => {
		const { learner, session } = await learnerWithCheckout();
		const orphan = { ...session, id: `cs_test_${hex()}`, payment_intent: `pi_${hex()}` };
		const sent = signedEvent('checkout.session.completed', orphan);
		expect((await postWebhook(sent.body, sent.header)).status).toBe(200);
		const rebuilt = await db.query.payments.findFirst({ where: eq(payments.checkoutSessionId, orphan.id) });
		expect(rebuilt).toMatchObject({ userId: learner.id, courseId, status: 'paid', amountCents: price });
		expect((await enrolmentsOf(learner.id))[0]).toMatchObject({ status: 'active', paymentId: rebuilt!.id });

		const stranger = { ...orphan, id: `cs_test_${hex()}`, client_reference_id: 'nobody', metadata: { userId: 'nobody', courseId: String(courseId) } };
		const strange = signedEvent('checkout.session.completed', stranger);
		expect((await postWebhook(strange.body, strange.header)).status).toBe(200);
		expect(await db.query.payments.findFirst({ where: eq(payments.checkoutSessionId, stranger.id) })).toBeUndefined();
	});
});

describe('signatures', () => {
	test('a bad signature gets 400 and changes nothing', async () => {
		const { learner, payment, session } = await learnerWithCheckout();
		const wrongSecret = signedEvent('checkout.session.completed', session, { secret: 'whsec_someone_else' });
		const good = signedEvent('checkout.session.completed', session);
		const altered = good.body.replace(`"amount_total": ${price}`, '"amount_total": 1');
		expect(altered).not.toBe(good.body);
		// older than the SDK's five-minute tolerance: a captured request replayed later
		const stale = signedEvent('checkout.session.completed', session, { timestamp: Math.floor(Date.now() / 1000) - 600 });

		const attempts = [
			await postWebhook(wrongSecret.body, wrongSecret.header),
			await postWebhook(altered, good.header),
			await postWebhook(stale.body, stale.header),
			await postWebhook(good.body, null),
			await postWebhook(good.body, 't=1,v1=deadbeef'),
			await postWebhook('not json at all', good.header)
		];
		for (const reply of attempts) {
			expect(reply.status).toBe(400);
			expect(reply.json).toMatchObject({ received: false, error: 'bad-signature' });
		}
		expect(await storedEvents([wrongSecret.id, good.id, stale.id])).toEqual([]);
		expect((await paymentRow(payment.id)).status).toBe('pending');
		expect(await enrolmentsOf(learner.id)).toEqual([]);
	});
});

describe('refunds', () => {
	test('a partial refund keeps access; the full refund revokes it and mails a notice; a replay changes nothing', async () => {
		const { learner, user, payment, session, charge } = await learnerWithCheckout();
		const completed = signedEvent('checkout.session.completed', session);
		await postWebhook(completed.body, completed.header);
		expect(await hasCourseAccess(user, courseId)).toBe(true);

		const partial = signedEvent('charge.refunded', charge(4900));
		expect((await postWebhook(partial.body, partial.header)).status).toBe(200);
		expect(await paymentRow(payment.id)).toMatchObject({ status: 'paid', refundedCents: 4900 });
		expect(await hasCourseAccess(user, courseId)).toBe(true);

		const full = signedEvent('charge.refunded', charge(price));
		expect((await postWebhook(full.body, full.header)).status).toBe(200);
		const refunded = await paymentRow(payment.id);
		expect(refunded).toMatchObject({ status: 'refunded', refundedCents: price });
		expect(refunded.refundedAt).toBeInstanceOf(Date);
		expect((await enrolmentsOf(learner.id))[0]).toMatchObject({ status: 'revoked' });
		expect(await hasCourseAccess(user, courseId)).toBe(false);

		// the partial event delivered late does not lower the refunded total
		expect((await postWebhook(partial.body, partial.header)).json).toMatchObject({ duplicate: true });
		const latePartial = signedEvent('charge.refunded', charge(4900));
		await postWebhook(latePartial.body, latePartial.header);
		expect(await paymentRow(payment.id)).toMatchObject({ status: 'refunded', refundedCents: price });

		const notice = await waitForMail(learner.email, /Your Stopwise refund/);
		expect(notice.text).toContain('We refunded $149.00');
	});

	test('an enrolment granted by hand is not closed by refunding an earlier payment', async () => {
		const { learner, user, session, charge, payment } = await learnerWithCheckout();
		const completed = signedEvent('checkout.session.completed', session);
		await postWebhook(completed.body, completed.header);
		// what the admin's grant does (grantEnrolment) on top of the paid enrolment
		await activateEnrolment(db, { userId: learner.id, courseId, source: 'admin', paymentId: null });
		const full = signedEvent('charge.refunded', charge(price));
		await postWebhook(full.body, full.header);
		expect((await paymentRow(payment.id)).status).toBe('refunded');
		expect(await hasCourseAccess(user, courseId)).toBe(true);
	});
});

describe('out-of-order delivery', () => {
	test('a full refund arriving before the completion never leaves an active enrolment', async () => {
		const { learner, user, payment, session, charge } = await learnerWithCheckout();
		const full = signedEvent('charge.refunded', charge(price));
		expect((await postWebhook(full.body, full.header)).status).toBe(200);
		expect(await storedEvents([full.id])).toEqual([{ id: full.id, processedAt: expect.any(Date) }]);

		const completed = signedEvent('checkout.session.completed', session);
		expect((await postWebhook(completed.body, completed.header)).status).toBe(200);
		expect(await paymentRow(payment.id)).toMatchObject({ status: 'refunded', refundedCents: price, paymentIntentId: session.payment_intent });
		expect((await enrolmentsOf(learner.id)).filter((e) => e.status === 'active')).toEqual([]);
		expect(await hasCourseAccess(user, courseId)).toBe(false);

		// the success page, opened afterwards, settles to the same answer
		await settleRetrievedSession(session as never, 'http://localhost:4173');
		expect(await hasCourseAccess(user, courseId)).toBe(false);
	});

	test('a partial refund arriving first is remembered; access opens with the completion', async () => {
		const { user, payment, session, charge } = await learnerWithCheckout();
		const partial = signedEvent('charge.refunded', charge(2000));
		await postWebhook(partial.body, partial.header);
		const completed = signedEvent('checkout.session.completed', session);
		await postWebhook(completed.body, completed.header);
		expect(await paymentRow(payment.id)).toMatchObject({ status: 'paid', refundedCents: 2000 });
		expect(await hasCourseAccess(user, courseId)).toBe(true);
	});

	test('completion and full refund delivered at the same moment end refunded, without access, every time', async () => {
		for (let round = 0; round < 6; round++) {
			const { user, payment, session, charge } = await learnerWithCheckout();
			const completed = signedEvent('checkout.session.completed', session);
			const full = signedEvent('charge.refunded', charge(price));
			const pair = [() => postWebhook(completed.body, completed.header), () => postWebhook(full.body, full.header)];
			if (round % 2) pair.reverse();
			const replies = await Promise.all(pair.map((send) => send()));
			expect(replies.map((r) => r.status)).toEqual([200, 200]);
			expect((await paymentRow(payment.id)).status, `round ${round}`).toBe('refunded');
			expect(await hasCourseAccess(user, courseId), `round ${round}`).toBe(false);
		}
	});
});

describe('other events', () => {
	test('an expired session cancels its pending payment; an unknown event type is stored and ignored', async () => {
		const { learner, payment, session } = await learnerWithCheckout();
		const expired = signedEvent('checkout.session.expired', { ...session, status: 'expired', payment_status: 'unpaid', payment_intent: null });
		expect((await postWebhook(expired.body, expired.header)).status).toBe(200);
		expect((await paymentRow(payment.id)).status).toBe('cancelled');

		const other = signedEvent('customer.created', { id: `cus_${hex()}`, object: 'customer' });
		expect(await postWebhook(other.body, other.header)).toEqual({ status: 200, json: { received: true } });
		expect(await storedEvents([other.id])).toHaveLength(1);
		expect(await enrolmentsOf(learner.id)).toEqual([]);
	});
});

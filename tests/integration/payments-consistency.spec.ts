// Money and access stay consistent: one open checkout per learner and course, every payment remembered, and
// property tests over random checkout / pay / refund / replay / out-of-order sequences against the payment fake.
import { and, eq } from 'drizzle-orm';
import fc from 'fast-check';
import Stripe from 'stripe';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { AuthUser } from '$lib/server/auth';
import { db } from '$lib/server/db';
import { courses, enrolments, payments } from '$lib/server/db/schema';
import { hasCourseAccess } from '$lib/server/enrolment-access';
import { grantEnrolment } from '$lib/server/payments/admin-enrolments';
import { refundPayment } from '$lib/server/payments/admin-payments';
import { startCheckout } from '$lib/server/payments/checkout';
import { confirmCheckout } from '$lib/server/payments/confirm';
import { getStripe } from '$lib/server/payments/stripe';
import { demoAccount, freshLearner, removeFreshPeople, userIdOf } from './support/people';
import { pointAppAt, postWebhook, removeTestEvents, startStripeFake, stopStripeFake, testWebhookSecret, type Fake } from './support/payments';
import { origin } from './support/request-event';

const slug = 'daylight-flash-for-action';
const coupon = 'HARBOR20';
let fake: Fake;
let restoreEnv: () => void;
let course: { id: number; priceCents: number; currency: string; title: string };
let admin: { id: string; email: string };

beforeAll(async () => {
	// no webhook URL: the tests deliver the fake's events themselves, in the order they choose
	fake = await startStripeFake('');
	restoreEnv = pointAppAt(fake.port);
	course = (await db.query.courses.findFirst({ where: eq(courses.slug, slug) }))!;
	const email = demoAccount('admin').email;
	admin = { id: await userIdOf(email), email };
});
afterAll(async () => {
	await stopStripeFake(fake);
	restoreEnv?.();
	await removeTestEvents();
	await removeFreshPeople();
});

type FakeEvent = { id: string; type: string; data: { object: Record<string, unknown> } };

async function fakeEvents(): Promise<FakeEvent[]> {
	const res = await fetch(`${fake.base}/__fake/events`);
	return ((await res.json()) as { data: { event: FakeEvent }[] }).data.map((d) => d.event);
}

/** Delivers one of the fake's events to the webhook route, signed as the fake signs it (same bytes). */
async function deliver(event: FakeEvent) {
	const body = JSON.stringify(event, null, 2);
	const header = Stripe.webhooks.generateTestHeaderString({ payload: body, secret: testWebhookSecret });
	const reply = await postWebhook(body, header);
	expect(reply.status, `${event.type} ${event.id}`).toBe(200);
}

function payPage(sessionId: string) {
	return fetch(`${fake.base}/pay/${sessionId}`, { method: 'POST', body: new URLSearchParams({ card: '4242424242424242', action: 'pay' }), redirect: 'manual' });
}

async function learnerUser() {
	const learner = await freshLearner();
	const user = { id: learner.id, email: learner.email, name: 'Test Person', roles: ['learner'] } as unknown as AuthUser;
	return { learner, user };
}

async function paymentsOf(userId: string) {
	return db.select().from(payments).where(and(eq(payments.userId, userId), eq(payments.courseId, course.id))).orderBy(payments.id);
}

/** A session opened beside the app's own checkout (a second server, a race past the lock): the row the app would insert. */
async function sessionOutsideTheLock(user: AuthUser, withCoupon: boolean) {
	const amount = withCoupon ? Math.round(course.priceCents * 0.8) : course.priceCents;
	const metadata = { userId: user.id, courseId: String(course.id), ...(withCoupon ? { coupon } : {}) };
	const session = await getStripe()!.checkout.sessions.create({
		mode: 'payment',
		line_items: [{ price_data: { currency: course.currency, unit_amount: amount, product_data: { name: course.title } }, quantity: 1 }],
		client_reference_id: user.id,
		metadata,
		success_url: `${origin}/checkout/done?session_id={CHECKOUT_SESSION_ID}`
	});
	await db.insert(payments).values({ userId: user.id, courseId: course.id, checkoutSessionId: session.id, amountCents: amount, currency: course.currency, couponCode: withCoupon ? coupon : null });
	return session.id;
}

describe('one open checkout per learner and course', () => {
	test('opening a checkout with a coupon after one without expires the first: it can no longer be paid', async () => {
		const { learner, user } = await learnerUser();
		const first = await startCheckout(user, slug, '', origin);
		const second = await startCheckout(user, slug, coupon, origin);
		expect(first).toMatchObject({ kind: 'redirect' });
		expect(second).toMatchObject({ kind: 'redirect' });
		const rows = await paymentsOf(learner.id);
		expect(rows.map((r) => [r.status, r.couponCode])).toEqual([
			['cancelled', null],
			['pending', coupon]
		]);
		expect((await payPage(rows[0].checkoutSessionId)).status).toBe(410);
		expect((await getStripe()!.checkout.sessions.retrieve(rows[0].checkoutSessionId)).status).toBe('expired');

		// and back without the coupon: the coupon session is expired in turn, one payable session remains
		await startCheckout(user, slug, '', origin);
		const after = await paymentsOf(learner.id);
		expect(after.filter((r) => r.status === 'pending')).toHaveLength(1);
		expect(after.filter((r) => r.status === 'pending')[0].couponCode).toBeNull();
	});

	test('a session paid a moment before the second checkout is settled instead of opening another', async () => {
		const { learner, user } = await learnerUser();
		await startCheckout(user, slug, '', origin);
		const [row] = await paymentsOf(learner.id);
		expect((await payPage(row.checkoutSessionId)).status).toBe(303);
		expect(await startCheckout(user, slug, coupon, origin)).toEqual({ kind: 'enrolled', already: true });
		expect((await paymentsOf(learner.id)).map((r) => r.status)).toEqual(['paid']);
	});
});

describe('an enrolment paid twice', () => {
	test('two checkouts paid (with and without a coupon); refunding one keeps access, refunding both closes it', async () => {
		const { learner, user } = await learnerUser();
		const a = await sessionOutsideTheLock(user, false);
		const b = await sessionOutsideTheLock(user, true);
		for (const id of [a, b]) {
			expect((await payPage(id)).status).toBe(303);
			await confirmCheckout(user, id, origin);
		}
		const [pa, pb] = await paymentsOf(learner.id);
		expect([pa.status, pb.status]).toEqual(['paid', 'paid']);
		expect(await hasCourseAccess(user, course.id)).toBe(true);

		const one = await refundPayment(pa.id, origin);
		expect(one).toMatchObject({ ok: true, message: expect.stringMatching(/keeps access/) });
		expect((await paymentsOf(learner.id)).map((p) => p.status)).toEqual(['refunded', 'paid']);
		expect(await hasCourseAccess(user, course.id)).toBe(true);
		const [enrolment] = await db.select().from(enrolments).where(and(eq(enrolments.userId, learner.id), eq(enrolments.courseId, course.id)));
		expect(enrolment).toMatchObject({ status: 'active', paymentId: pb.id });

		// the provider's own events for both, delivered late and twice, change nothing
		for (const event of [...(await fakeEvents()), ...(await fakeEvents())].filter((e) => JSON.stringify(e).includes(learner.id))) await deliver(event);
		expect(await hasCourseAccess(user, course.id)).toBe(true);

		expect(await refundPayment(pb.id, origin)).toMatchObject({ ok: true, message: expect.stringMatching(/no longer has access/) });
		expect(await hasCourseAccess(user, course.id)).toBe(false);
	});
});

type Op =
	| { op: 'checkout'; coupon: boolean }
	| { op: 'outside-lock'; coupon: boolean }
	| { op: 'pay'; which: number; back: boolean }
	| { op: 'success-page'; which: number }
	| { op: 'admin-refund'; which: number }
	| { op: 'provider-refund'; which: number; partial: boolean }
	| { op: 'deliver'; which: number }
	| { op: 'replay'; which: number }
	| { op: 'grant' };

const which = fc.nat({ max: 20 });
const opArb: fc.Arbitrary<Op> = fc.oneof(
	{ weight: 3, arbitrary: fc.record({ op: fc.constant('checkout' as const), coupon: fc.boolean() }) },
	{ weight: 3, arbitrary: fc.record({ op: fc.constant('outside-lock' as const), coupon: fc.boolean() }) },
	{ weight: 5, arbitrary: fc.record({ op: fc.constant('pay' as const), which, back: fc.boolean() }) },
	{ weight: 1, arbitrary: fc.record({ op: fc.constant('success-page' as const), which }) },
	{ weight: 2, arbitrary: fc.record({ op: fc.constant('admin-refund' as const), which }) },
	{ weight: 2, arbitrary: fc.record({ op: fc.constant('provider-refund' as const), which, partial: fc.boolean() }) },
	{ weight: 3, arbitrary: fc.record({ op: fc.constant('deliver' as const), which }) },
	{ weight: 2, arbitrary: fc.record({ op: fc.constant('replay' as const), which }) },
	{ weight: 1, arbitrary: fc.record({ op: fc.constant('grant' as const) }) }
);

/** Access as the stored rows say it should be: a payment paid and not fully refunded, or a grant. */
async function storedTruth(userId: string): Promise<boolean> {
	const paid = (await paymentsOf(userId)).some((p) => p.status === 'paid');
	const [row] = await db.select().from(enrolments).where(and(eq(enrolments.userId, userId), eq(enrolments.courseId, course.id)));
	return paid || Boolean(row?.grantedAt);
}

/** Access as the money says it should be: a session paid at the provider whose charge is not fully refunded, or a grant. */
async function providerTruth(sessionIds: string[], granted: boolean): Promise<boolean> {
	if (granted) return true;
	const stripe = getStripe()!;
	for (const id of sessionIds) {
		const session = await stripe.checkout.sessions.retrieve(id, { expand: ['payment_intent.latest_charge'] });
		const intent = session.payment_intent as Stripe.PaymentIntent | null;
		const charge = intent?.latest_charge as Stripe.Charge | null;
		if (session.payment_status === 'paid' && charge && charge.amount_refunded < charge.amount) return true;
	}
	return false;
}

describe('access ⇔ a paid, not fully refunded payment or an admin grant', () => {
	test('holds after every step of random sequences, and once every event has arrived in any order, twice', async () => {
		await fc.assert(
			fc.asyncProperty(fc.array(opArb, { minLength: 1, maxLength: 12 }), fc.array(fc.nat(), { maxLength: 30 }), async (ops, order) => {
				const { learner, user } = await learnerUser();
				const before = new Set((await fakeEvents()).map((e) => e.id));
				const delivered: FakeEvent[] = [];
				let granted = false;
				const sessions = async () => (await paymentsOf(learner.id)).map((p) => p.checkoutSessionId);
				const mine = async () => (await fakeEvents()).filter((e) => !before.has(e.id));
				const pick = <T>(list: T[], n: number): T | undefined => (list.length ? list[n % list.length] : undefined);

				for (const step of ops) {
					if (step.op === 'checkout') await startCheckout(user, slug, step.coupon ? coupon : '', origin);
					if (step.op === 'outside-lock') await sessionOutsideTheLock(user, step.coupon);
					if (step.op === 'pay') {
						// mostly the ones still pending; sometimes any (a second Pay, an expired page)
						const pending = (await paymentsOf(learner.id)).filter((p) => p.status === 'pending').map((p) => p.checkoutSessionId);
						const id = pick(step.which % 4 ? pending : await sessions(), step.which);
						// `back`: the browser follows the redirect to the success page (else the tab was closed)
						if (id && (await payPage(id)).status === 303 && step.back) await confirmCheckout(user, id, origin);
					}
					if (step.op === 'success-page') {
						const id = pick(await sessions(), step.which);
						if (id) await confirmCheckout(user, id, origin);
					}
					if (step.op === 'admin-refund') {
						const p = pick((await paymentsOf(learner.id)).filter((p) => step.which % 4 === 0 || p.status === 'paid'), step.which);
						if (p) await refundPayment(p.id, origin);
					}
					if (step.op === 'provider-refund') {
						const id = pick((await paymentsOf(learner.id)).filter((p) => p.status !== 'cancelled').map((p) => p.checkoutSessionId), step.which);
						const session = id ? await getStripe()!.checkout.sessions.retrieve(id) : null;
						const intent = typeof session?.payment_intent === 'string' ? session.payment_intent : null;
						if (intent) await getStripe()!.refunds.create({ payment_intent: intent, ...(step.partial ? { amount: 1000 } : {}) }).catch(() => null);
					}
					if (step.op === 'deliver') {
						const event = pick((await mine()).filter((e) => !delivered.some((d) => d.id === e.id)), step.which);
						if (event) {
							await deliver(event);
							delivered.push(event);
						}
					}
					if (step.op === 'replay') {
						const event = pick(delivered, step.which);
						if (event) await deliver(event);
					}
					if (step.op === 'grant') {
						await grantEnrolment(admin, learner.email, slug);
						granted = true;
					}
					expect(await hasCourseAccess(user, course.id), `after ${JSON.stringify(step)}`).toBe(await storedTruth(learner.id));
				}

				// everything the provider sent, in a random order, each at least once and some twice
				const rest = await mine();
				const shuffled = [...rest];
				order.forEach((n, i) => {
					const j = n % shuffled.length;
					const k = i % shuffled.length;
					[shuffled[j], shuffled[k]] = [shuffled[k], shuffled[j]];
				});
				for (const event of [...shuffled, ...shuffled.slice(0, order.length % (shuffled.length + 1))]) await deliver(event);

				const access = await hasCourseAccess(user, course.id);
				expect(access).toBe(await storedTruth(learner.id));
				expect(access, JSON.stringify(ops)).toBe(await providerTruth(await sessions(), granted));
				// at most one session a learner could still pay for, among those the app opened itself
				const open = [];
				for (const p of (await paymentsOf(learner.id)).filter((p) => p.status === 'pending')) {
					if ((await getStripe()!.checkout.sessions.retrieve(p.checkoutSessionId)).status === 'open') open.push(p.id);
				}
				expect(open.length).toBeLessThanOrEqual(1 + ops.filter((o) => o.op === 'outside-lock').length);
			}),
			// every run is a few round trips to the fake: report the first counterexample as found rather than shrink it
			{ numRuns: 20, endOnFailure: true }
		);
	}, 180_000);
});

describe('several payments for one course', () => {
	test('refunding any of them, in any order and by any route, closes access only with the last', async () => {
		const plan = fc.record({
			// each session: paid with or without a coupon, settled by the success page or by its webhook
			sessions: fc.array(fc.record({ coupon: fc.boolean(), bySuccessPage: fc.boolean() }), { minLength: 2, maxLength: 3 }),
			// refunds: which session, by the admin (settled at once) or at the provider (settled by the webhook)
			refunds: fc.array(fc.record({ which: fc.nat(), byAdmin: fc.boolean() }), { minLength: 1, maxLength: 4 })
		});
		await fc.assert(
			fc.asyncProperty(plan, async ({ sessions, refunds }) => {
				const { learner, user } = await learnerUser();
				const before = new Set((await fakeEvents()).map((e) => e.id));
				const delivered = new Set<string>();
				const deliverNew = async () => {
					for (const event of (await fakeEvents()).filter((e) => !before.has(e.id) && !delivered.has(e.id))) {
						delivered.add(event.id);
						await deliver(event);
					}
				};
				const ids: string[] = [];
				for (const s of sessions) {
					const id = await sessionOutsideTheLock(user, s.coupon);
					ids.push(id);
					expect((await payPage(id)).status).toBe(303);
					if (s.bySuccessPage) await confirmCheckout(user, id, origin);
				}
				await deliverNew();
				const refunded = new Set<number>();
				for (const r of refunds) {
					const i = r.which % ids.length;
					const [payment] = (await paymentsOf(learner.id)).filter((p) => p.checkoutSessionId === ids[i]);
					if (r.byAdmin) await refundPayment(payment.id, origin);
					else {
						await getStripe()!.refunds.create({ payment_intent: payment.paymentIntentId! }).catch(() => null);
						await deliverNew();
					}
					refunded.add(i);
					expect(await hasCourseAccess(user, course.id), `refunded ${[...refunded]} of ${ids.length}`).toBe(refunded.size < ids.length);
				}
			}),
			{ numRuns: 8, endOnFailure: true }
		);
	}, 120_000);
});

// Enrolment end to end against the local payment fake, through the SDK: Enrol → payment page → success page and
// webhook → access; a declined card, a cancel, coupons, a second click, an unreachable service, an admin refund.
import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { db } from '$lib/server/db';
import { courses, enrolments, payments, webhookEvents } from '$lib/server/db/schema';
import { hasCourseAccess } from '$lib/server/enrolment-access';
import { listMail } from '$lib/server/mailbox';
import { backgroundMailDrained } from '$lib/server/mail';
import { getStripe } from '$lib/server/payments/stripe';
import * as coursePage from '../../src/routes/(public)/courses/[course]/+page.server';
import * as donePage from '../../src/routes/(learn)/checkout/done/+page.server';
import * as adminPayments from '../../src/routes/(admin)/admin/payments/+page.server';
import { failureOf, makeEvent, throughHooks, type TestCookies } from './support/request-event';
import { demoAccount, freshLearner, removeFreshPeople, signedInCookies } from './support/people';
import { waitForMail } from './support/mail';
import { pointAppAt, removeTestEvents, startStripeFake, startWebhookRelay, stopStripeFake, waitUntil, type Fake } from './support/payments';

const slug = 'daylight-flash-for-action';
let fake: Fake;
let relay: Awaited<ReturnType<typeof startWebhookRelay>>;
let restoreEnv: () => void;
let courseId: number;

beforeAll(async () => {
	relay = await startWebhookRelay();
	fake = await startStripeFake(relay.url);
	restoreEnv = pointAppAt(fake.port);
	courseId = (await db.query.courses.findFirst({ where: eq(courses.slug, slug) }))!.id;
});
afterAll(async () => {
	await stopStripeFake(fake);
	await relay?.close();
	restoreEnv?.();
	await removeTestEvents();
	await removeFreshPeople();
});

async function enrol(cookies: TestCookies | undefined, coupon = '') {
	const event = makeEvent({ path: `/courses/${slug}?/enrol`, form: { coupon }, cookies, params: { course: slug } });
	return throughHooks(event, (e) => coursePage.actions.enrol(e as never));
}

async function signedInLearner() {
	const learner = await freshLearner();
	return { ...learner, cookies: await signedInCookies(learner.email), user: { id: learner.id, roles: ['learner' as const] } };
}

/** Submits the fake's payment page as the browser would, without following the redirect. */
function submitPayPage(url: string, fields: Record<string, string>) {
	return fetch(url, { method: 'POST', body: new URLSearchParams(fields), redirect: 'manual' });
}

async function visitDone(location: string, cookies: TestCookies) {
	const url = new URL(location);
	return throughHooks(makeEvent({ path: url.pathname + url.search, cookies }), (e) => donePage.load(e as never));
}

async function paymentsOf(userId: string) {
	return db.select().from(payments).where(eq(payments.userId, userId));
}

async function startedCheckout(learner: Awaited<ReturnType<typeof signedInLearner>>, coupon = '') {
	const outcome = await enrol(learner.cookies, coupon);
	expect(outcome).toMatchObject({ kind: 'redirect', status: 303 });
	return (outcome as { location: string }).location;
}

describe('paying for a course', () => {
	test('Enrol → pay with a test card → the success page opens the course at once; the webhook then changes nothing', async () => {
		const learner = await signedInLearner();
		const payUrl = await startedCheckout(learner);
		expect(payUrl).toMatch(new RegExp(`^${fake.base}/pay/cs_test_`));
		const [pending] = await paymentsOf(learner.id);
		expect(pending).toMatchObject({ status: 'pending', amountCents: 14900, currency: 'usd', couponCode: null });
		const session = await getStripe()!.checkout.sessions.retrieve(pending.checkoutSessionId);
		expect(session).toMatchObject({ customer_email: learner.email, client_reference_id: learner.id, amount_total: 14900 });
		expect(session.success_url).toBe('http://localhost:4173/checkout/done?session_id={CHECKOUT_SESSION_ID}');
		expect(session.cancel_url).toBe(`http://localhost:4173/courses/${slug}?checkout=cancelled`);

		const paid = await submitPayPage(payUrl, { card: '4242 4242 4242 4242', action: 'pay' });
		expect(paid.status).toBe(303);
		const back = paid.headers.get('location')!;
		expect(back).toBe(`http://localhost:4173/checkout/done?session_id=${pending.checkoutSessionId}`);

		const done = await visitDone(back, learner.cookies);
		expect(done).toMatchObject({ kind: 'value', value: { outcome: { kind: 'paid', enrolled: true, refunded: false, course: { slug } } } });
		expect(await hasCourseAccess(learner.user, courseId)).toBe(true);

		// the fake's signed checkout.session.completed reaches the route too
		await waitUntil(async () => {
			const stored = await db.select().from(webhookEvents).where(eq(webhookEvents.type, 'checkout.session.completed'));
			return stored.some((e) => (e.payload as { data: { object: { id: string } } }).data.object.id === pending.checkoutSessionId);
		}, 'the completion event');
		expect(relay.statuses.every((s) => s === 200)).toBe(true);
		const rows = await db.select().from(enrolments).where(and(eq(enrolments.userId, learner.id), eq(enrolments.courseId, courseId)));
		expect(rows).toHaveLength(1);
		expect((await paymentsOf(learner.id)).map((p) => p.status)).toEqual(['paid']);
		await waitForMail(learner.email, /Your Stopwise receipt/);
		// every mail sent after an answer has gone: a late duplicate would be in the mailbox now
		await backgroundMailDrained();
		expect((await listMail()).filter((m) => m.to.includes(learner.email) && /receipt/.test(m.subject))).toHaveLength(1);

		// Enrol again: nothing to pay, a message instead
		expect(await enrol(learner.cookies)).toEqual({ kind: 'redirect', status: 303, location: `/courses/${slug}?checkout=already` });
	});

	test('a declined card leaves the session open and no access; cancelling comes back with a clear message', async () => {
		const learner = await signedInLearner();
		const payUrl = await startedCheckout(learner);
		const declined = await submitPayPage(payUrl, { card: '4000 0000 0000 0002', action: 'pay' });
		expect(declined.status).toBe(402);
		expect(await declined.text()).toContain('Your card was declined.');
		const [payment] = await paymentsOf(learner.id);
		expect(payment.status).toBe('pending');
		expect(await hasCourseAccess(learner.user, courseId)).toBe(false);

		// going to the success address by hand does not enrol an unpaid session
		const done = await visitDone(`http://localhost:4173/checkout/done?session_id=${payment.checkoutSessionId}`, learner.cookies);
		expect(done).toMatchObject({ kind: 'value', value: { outcome: { kind: 'open', url: payUrl } } });
		expect(await hasCourseAccess(learner.user, courseId)).toBe(false);

		const cancelled = await submitPayPage(payUrl, { card: '', action: 'cancel' });
		expect(cancelled.status).toBe(303);
		const back = new URL(cancelled.headers.get('location')!);
		expect(back.pathname + back.search).toBe(`/courses/${slug}?checkout=cancelled`);
		const page = await throughHooks(makeEvent({ path: back.pathname + back.search, cookies: learner.cookies, params: { course: slug } }), (e) =>
			coursePage.load(e as never)
		);
		expect(page).toMatchObject({
			kind: 'value',
			value: { enrolment: 'not-enrolled', notice: { tone: 'error', text: expect.stringContaining('nothing was charged and you are not enrolled') } }
		});
	});

	test('a second click on Enrol goes to the same open payment page', async () => {
		const learner = await signedInLearner();
		const first = await startedCheckout(learner);
		const second = await startedCheckout(learner);
		expect(second).toBe(first);
		expect(await paymentsOf(learner.id)).toHaveLength(1);
	});

	test('a coupon takes its percentage off the session; an unknown coupon is refused with a message', async () => {
		const learner = await signedInLearner();
		const refused = await enrol(learner.cookies, 'NOT-A-CODE');
		expect(failureOf((refused as { value: unknown }).value)).toEqual({
			status: 400,
			data: { enrol: { message: 'The coupon NOT-A-CODE is not valid or has ended.', coupon: 'NOT-A-CODE' } }
		});
		await startedCheckout(learner, ' harbor20 ');
		const [payment] = await paymentsOf(learner.id);
		expect(payment).toMatchObject({ amountCents: 11920, couponCode: 'HARBOR20' });
		const session = await getStripe()!.checkout.sessions.retrieve(payment.checkoutSessionId, { expand: ['line_items'] });
		expect(session.amount_total).toBe(11920);
		expect(session.line_items?.data[0].description).toBe('Daylight Flash for Action (coupon HARBOR20: 20% off)');
	});

	test('signed out, Enrol sends to sign-in and back to the course', async () => {
		expect(await enrol(undefined)).toEqual({
			kind: 'redirect',
			status: 303,
			location: `/signin?redirectTo=${encodeURIComponent(`/courses/${slug}?/enrol`)}`
		});
	});

	test('an unreachable payment service gets a clear message and stores nothing', async () => {
		const learner = await signedInLearner();
		const restore = pointAppAt(1);
		try {
			const outcome = await enrol(learner.cookies);
			expect(failureOf((outcome as { value: unknown }).value)).toMatchObject({ status: 502, data: { enrol: { message: expect.stringMatching(/Nothing was charged/) } } });
		} finally {
			restore();
		}
		expect(await paymentsOf(learner.id)).toEqual([]);
	});
});

describe('an admin refund', () => {
	async function refund(cookies: TestCookies, paymentId: number, reason?: string) {
		const event = makeEvent({ path: '/admin/payments?/refund', form: { paymentId: String(paymentId), ...(reason === undefined ? {} : { reason }) }, cookies });
		return throughHooks(event, (e) => adminPayments.actions.refund(e as never));
	}

	test('refunds at the provider, closes access at once, and the webhook that follows changes nothing', async () => {
		const learner = await signedInLearner();
		const payUrl = await startedCheckout(learner);
		const paid = await submitPayPage(payUrl, { card: '4242424242424242', action: 'pay' });
		await visitDone(paid.headers.get('location')!, learner.cookies);
		const [payment] = await paymentsOf(learner.id);
		expect(payment.status).toBe('paid');

		const notAdmin = await refund(await signedInCookies(demoAccount('mentor').email), payment.id);
		expect(notAdmin).toMatchObject({ kind: 'error', status: 403 });
		expect((await paymentsOf(learner.id))[0].status).toBe('paid');

		const admin = await signedInCookies(demoAccount('admin').email);
		// a reason too long for the audit log: the message sits beside the field, what was typed comes back, nothing is refunded
		const tooLong = await refund(admin, payment.id, 'x'.repeat(501));
		expect(failureOf((tooLong as { value: unknown }).value)).toMatchObject({
			status: 400,
			data: { form: { errors: { reason: ['Keep the reason under 500 characters.'] }, data: { reason: 'x'.repeat(501) } } }
		});
		expect((await paymentsOf(learner.id))[0].status).toBe('paid');
		const deliveriesBefore = relay.statuses.length;
		const done = await refund(admin, payment.id);
		expect(done).toMatchObject({
			kind: 'value',
			value: { form: { valid: true, data: { paymentId: payment.id }, message: { ok: true, text: expect.stringMatching(/^Refunded/) } } }
		});
		expect((await paymentsOf(learner.id))[0]).toMatchObject({ status: 'refunded', refundedCents: 14900 });
		expect(await hasCourseAccess(learner.user, courseId)).toBe(false);

		const intent = (await paymentsOf(learner.id))[0].paymentIntentId!;
		await waitUntil(async () => {
			const stored = await db.select().from(webhookEvents).where(eq(webhookEvents.type, 'charge.refunded'));
			return stored.some((e) => (e.payload as { data: { object: { payment_intent: string } } }).data.object.payment_intent === intent);
		}, 'the charge.refunded webhook');
		expect(await hasCourseAccess(learner.user, courseId)).toBe(false);
		// the relay records a delivery once the route has answered, i.e. after it handed its mail to the background
		await waitUntil(async () => relay.statuses.length > deliveriesBefore, 'the webhook route to answer');
		await waitForMail(learner.email, /Your Stopwise refund/);
		// every mail sent after an answer has gone: a late duplicate would be in the mailbox now
		await backgroundMailDrained();
		expect((await listMail()).filter((m) => m.to.includes(learner.email) && /refund/.test(m.subject))).toHaveLength(1);

		const again = await refund(admin, payment.id);
		expect(failureOf((again as { value: unknown }).value)).toMatchObject({
			status: 400,
			data: { form: { message: { ok: false, text: expect.stringMatching(/Only paid payments/) } } }
		});
	});
});

// Starting an enrolment: price (with a coupon), then a Checkout Session at the provider and a pending payment row.
import { and, desc, eq, gt, sql } from 'drizzle-orm';
import type { AuthUser } from '../auth';
import { db } from '../db';
import { courses, payments, type Course } from '../db/schema';
import { discountedCents, findCoupon } from './coupons';
import { settleRetrievedSession } from './confirm';
import { activateEnrolment, isEnrolled } from './enrolments';
import { getStripe, isStripeError } from './stripe';

export type CheckoutStart =
	| { kind: 'redirect'; url: string }
	| { kind: 'enrolled'; already: boolean }
	| { kind: 'refused'; status: number; message: string };

const unreachable = 'We could not reach the payment service just now. Nothing was charged; please try again in a minute.';

export async function startCheckout(user: AuthUser, courseSlug: string, couponTyped: string, origin: string): Promise<CheckoutStart> {
	const course = await db.query.courses.findFirst({ where: and(eq(courses.slug, courseSlug), eq(courses.published, true)) });
	if (!course) return { kind: 'refused', status: 404, message: 'There is no such course.' };
	if (await isEnrolled(db, user.id, course.id)) return { kind: 'enrolled', already: true };

	let coupon: { code: string; percentOff: number } | null = null;
	if (couponTyped.trim()) {
		const found = await findCoupon(couponTyped);
		if (!found.ok) return { kind: 'refused', status: 400, message: found.message };
		coupon = found;
	}
	const amount = discountedCents(course.priceCents, coupon?.percentOff ?? 0);
	// nothing to pay (a free course or a 100 % coupon): no checkout, just open the course
	if (amount === 0) {
		await activateEnrolment(db, { userId: user.id, courseId: course.id, source: 'free', paymentId: null, couponCode: coupon?.code ?? null });
		return { kind: 'enrolled', already: false };
	}

	const stripe = getStripe();
	if (!stripe) {
		console.error('[payments] STRIPE_SECRET_KEY is not set: enrolment cannot start a checkout');
		return { kind: 'refused', status: 503, message: 'Payments are not set up on this server yet. Please try again later.' };
	}
	const earlier = await reuseEarlierSession(user.id, course.id, amount, coupon?.code ?? null, origin);
	if (earlier) return earlier;

	try {
		const session = await stripe.checkout.sessions.create(sessionParams(user, course, amount, coupon, origin));
		if (!session.url) throw new Error(`session ${session.id} came back without a payment page URL`);
		await db.insert(payments).values({
			userId: user.id,
			courseId: course.id,
			checkoutSessionId: session.id,
			amountCents: amount,
			currency: course.currency,
			couponCode: coupon?.code ?? null
		});
		return { kind: 'redirect', url: session.url };
	} catch (e) {
		console.error('[payments] could not start a checkout', isStripeError(e) ? `${e.type} ${e.statusCode}: ${e.message}` : e);
		return { kind: 'refused', status: 502, message: unreachable };
	}
}

function sessionParams(user: AuthUser, course: Course, amount: number, coupon: { code: string; percentOff: number } | null, origin: string) {
	const metadata: Record<string, string> = { userId: user.id, courseId: String(course.id), courseSlug: course.slug };
	if (coupon) metadata.coupon = coupon.code;
	const name = coupon ? `${course.title} (coupon ${coupon.code}: ${coupon.percentOff}% off)` : course.title;
	return {
		mode: 'payment' as const,
		line_items: [{ price_data: { currency: course.currency, unit_amount: amount, product_data: { name } }, quantity: 1 }],
		customer_email: user.email,
		client_reference_id: user.id,
		metadata,
		payment_intent_data: { metadata, description: `Stopwise enrolment: ${course.title}` },
		// the provider puts the real session id in place of the literal {CHECKOUT_SESSION_ID}
		success_url: `${origin}/checkout/done?session_id={CHECKOUT_SESSION_ID}`,
		cancel_url: `${origin}/courses/${course.slug}?checkout=cancelled`
	};
}

/**
 * A second click on Enrol (or coming back after a declined card) goes to the session already open for the same
 * price, so one learner does not collect several payable sessions for one course; a session that was paid while
 * its webhook is still on the way is settled here instead of being charged twice.
 */
async function reuseEarlierSession(
	userId: string,
	courseId: number,
	amount: number,
	coupon: string | null,
	origin: string
): Promise<CheckoutStart | null> {
	const [candidate] = await db
		.select({ sessionId: payments.checkoutSessionId, coupon: payments.couponCode })
		.from(payments)
		.where(
			and(
				eq(payments.userId, userId),
				eq(payments.courseId, courseId),
				eq(payments.status, 'pending'),
				eq(payments.amountCents, amount),
				gt(payments.createdAt, sql`now() - interval '12 hours'`)
			)
		)
		.orderBy(desc(payments.createdAt))
		.limit(1);
	if (!candidate || candidate.coupon !== coupon) return null;
	try {
		const session = await getStripe()!.checkout.sessions.retrieve(candidate.sessionId);
		if (session.payment_status === 'paid') {
			await settleRetrievedSession(session, origin);
			return (await isEnrolled(db, userId, courseId)) ? { kind: 'enrolled', already: true } : null;
		}
		return session.status === 'open' && session.url ? { kind: 'redirect', url: session.url } : null;
	} catch (e) {
		// cannot tell: start a fresh session rather than fail the learner
		console.error('[payments] could not check an earlier session', e instanceof Error ? e.message : e);
		return null;
	}
}

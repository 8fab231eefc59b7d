// Starting an enrolment: price (with a coupon), then a Checkout Session at the provider and a pending payment row.
import { and, desc, eq, sql } from 'drizzle-orm';
import type { AuthUser } from '../auth';
import { db } from '../db';
import { courses, payments, type Course } from '../db/schema';
import { discountedCents, findCoupon } from './coupons';
import { settleRetrievedSession } from './confirm';
import { activateEnrolment, isEnrolled, type Tx } from './enrolments';
import { settleSessionExpired } from './settle';
import { getStripe, isStripeError, type Stripe } from './stripe';
import { couponThrottleKeysFor, recordFailure, secondsUntilUnlocked } from '../throttle';

const waitText = (seconds: number) => (seconds < 90 ? `${seconds} seconds` : `${Math.ceil(seconds / 60)} minutes`);

export type CheckoutStart =
	| { kind: 'redirect'; url: string }
	| { kind: 'enrolled'; already: boolean }
	| { kind: 'refused'; status: number; message: string };

const unreachable = 'We could not reach the payment service just now. Nothing was charged; please try again in a minute.';

/** `address`: the client's address, for throttling coupon guesses beside the learner's own count. */
export async function startCheckout(user: AuthUser, courseSlug: string, couponTyped: string, origin: string, address = 'unknown'): Promise<CheckoutStart> {
	const course = await db.query.courses.findFirst({ where: and(eq(courses.slug, courseSlug), eq(courses.published, true)) });
	if (!course) return { kind: 'refused', status: 404, message: 'There is no such course.' };
	if (await isEnrolled(db, user.id, course.id)) return { kind: 'enrolled', already: true };

	let coupon: { code: string; percentOff: number } | null = null;
	if (couponTyped.trim()) {
		const keys = couponThrottleKeysFor(user.id, address);
		const wait = await secondsUntilUnlocked(keys);
		if (wait > 0) return { kind: 'refused', status: 429, message: `Too many coupon codes tried. Wait ${waitText(wait)} and try again, or enrol without one.` };
		const found = await findCoupon(couponTyped);
		if (!found.ok) {
			await recordFailure(keys);
			return { kind: 'refused', status: 400, message: found.message };
		}
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
	// one checkout at a time per learner and course: a double click or a second tab waits for the first
	return db.transaction(async (tx) => {
		await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${`stopwise-checkout:${user.id}:${course.id}`}))`);
		const earlier = await settleEarlierSessions(tx, stripe, user.id, course.id, amount, coupon?.code ?? null, origin);
		if (earlier) return earlier;
		try {
			const session = await stripe.checkout.sessions.create(sessionParams(user, course, amount, coupon, origin));
			if (!session.url) throw new Error(`session ${session.id} came back without a payment page URL`);
			await tx.insert(payments).values({
				userId: user.id,
				courseId: course.id,
				checkoutSessionId: session.id,
				amountCents: amount,
				currency: course.currency,
				couponCode: coupon?.code ?? null
			});
			return { kind: 'redirect', url: session.url } as const;
		} catch (e) {
			console.error('[payments] could not start a checkout', isStripeError(e) ? `${e.type} ${e.statusCode}: ${e.message}` : e);
			return { kind: 'refused', status: 502, message: unreachable } as const;
		}
	});
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
 * At most one payable session per learner and course. A second click on Enrol (or coming back after a declined
 * card) goes to the session already open for the same price and coupon; an open session for another price (the
 * learner added or dropped a coupon) is expired at the provider first, so two payments cannot both go through;
 * a session that was paid while its webhook is still on the way is settled here instead of being charged twice.
 */
async function settleEarlierSessions(
	tx: Tx,
	stripe: Stripe,
	userId: string,
	courseId: number,
	amount: number,
	coupon: string | null,
	origin: string
): Promise<CheckoutStart | null> {
	const pending = await tx
		.select({ sessionId: payments.checkoutSessionId, coupon: payments.couponCode, amount: payments.amountCents })
		.from(payments)
		.where(and(eq(payments.userId, userId), eq(payments.courseId, courseId), eq(payments.status, 'pending')))
		.orderBy(desc(payments.createdAt), desc(payments.id));
	let reuse: string | null = null;
	try {
		for (const row of pending) {
			let session: Stripe.Checkout.Session = await stripe.checkout.sessions.retrieve(row.sessionId);
			const same = row.amount === amount && row.coupon === coupon;
			if (session.status === 'open' && !(same && reuse === null && session.url)) {
				session = await expireOrRead(stripe, row.sessionId);
			}
			if (session.payment_status === 'paid') {
				await settleRetrievedSession(session, origin);
				if (await isEnrolled(db, userId, courseId)) return { kind: 'enrolled', already: true };
			} else if (session.status === 'expired') {
				await settleSessionExpired(tx, session);
			} else if (session.status === 'open' && session.url) {
				reuse = session.url;
			}
		}
	} catch (e) {
		// an earlier session might still be payable: opening another could take the money twice
		console.error('[payments] could not check an earlier session', isStripeError(e) ? `${e.type} ${e.statusCode}: ${e.message}` : e);
		return { kind: 'refused', status: 502, message: unreachable };
	}
	return reuse ? { kind: 'redirect', url: reuse } : null;
}

/** Expires an open session; if it was paid or closed meanwhile, the provider refuses and its current state is read. */
async function expireOrRead(stripe: Stripe, sessionId: string): Promise<Stripe.Checkout.Session> {
	try {
		return await stripe.checkout.sessions.expire(sessionId);
	} catch (e) {
		if (isStripeError(e) && e.statusCode === 400) return stripe.checkout.sessions.retrieve(sessionId);
		throw e;
	}
}

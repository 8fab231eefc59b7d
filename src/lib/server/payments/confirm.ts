// The success page's side: fetch the session from the provider and settle it now, so access never waits on the webhook.
import { eq } from 'drizzle-orm';
import type Stripe from 'stripe';
import type { AuthUser } from '../auth';
import { db } from '../db';
import { courses, payments } from '../db/schema';
import { isEnrolled } from './enrolments';
import { mailSettlement } from './receipts';
import { settleSessionPaid, type Settled } from './settle';
import { getStripe, isStripeError } from './stripe';

type CourseRef = { slug: string; title: string };
export type CheckoutOutcome =
	| { kind: 'paid'; course: CourseRef; enrolled: boolean; refunded: boolean }
	| { kind: 'open'; course: CourseRef; url: string | null }
	| { kind: 'expired'; course: CourseRef }
	| { kind: 'missing' }
	| { kind: 'unavailable' };

/** The same idempotent settlement the webhook runs, then its e-mail; safe to call any number of times. */
export async function settleRetrievedSession(session: Stripe.Checkout.Session, origin: string): Promise<Settled> {
	const settled = await db.transaction((tx) => settleSessionPaid(tx, session));
	mailSettlement(settled, origin);
	return settled;
}

export async function confirmCheckout(user: AuthUser, sessionId: string, origin: string): Promise<CheckoutOutcome> {
	if (!/^cs_[A-Za-z0-9_]{1,250}$/.test(sessionId)) return { kind: 'missing' };
	const stripe = getStripe();
	if (!stripe) return { kind: 'unavailable' };
	let session: Stripe.Checkout.Session;
	try {
		session = await stripe.checkout.sessions.retrieve(sessionId);
	} catch (e) {
		if (isStripeError(e) && e.statusCode === 404) return { kind: 'missing' };
		console.error('[payments] could not retrieve a checkout session', e instanceof Error ? e.message : e);
		return { kind: 'unavailable' };
	}
	// someone else's session id tells this learner nothing (and settles nothing for them)
	const owner = session.metadata?.userId ?? session.client_reference_id;
	if (owner !== user.id) return { kind: 'missing' };
	const found = await courseOf(session);
	if (!found) return { kind: 'missing' };
	const course = { slug: found.slug, title: found.title };

	if (session.payment_status === 'paid') {
		await settleRetrievedSession(session, origin);
		const [payment] = await db.select({ status: payments.status }).from(payments).where(eq(payments.checkoutSessionId, session.id));
		return { kind: 'paid', course, enrolled: await isEnrolled(db, user.id, found.id), refunded: payment?.status === 'refunded' };
	}
	if (session.status === 'expired') return { kind: 'expired', course };
	return { kind: 'open', course, url: session.url };
}

async function courseOf(session: Stripe.Checkout.Session) {
	const id = Number(session.metadata?.courseId);
	if (!Number.isInteger(id)) return null;
	const row = await db.query.courses.findFirst({ where: eq(courses.id, id) });
	return row ? { id: row.id, slug: row.slug, title: row.title } : null;
}

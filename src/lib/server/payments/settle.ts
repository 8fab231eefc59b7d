// Applies what the provider reports (a session paid or expired, a charge refunded) to payments and enrolments, idempotently.
import { and, eq, sql } from 'drizzle-orm';
import type Stripe from 'stripe';
import { courses, payments, users, webhookEvents, type Payment } from '../db/schema';
import { activateEnrolment, lockEnrolment, revokeUnlessStillPaid, type Tx } from './enrolments';

export type SessionFacts = Pick<
	Stripe.Checkout.Session,
	'id' | 'status' | 'payment_status' | 'payment_intent' | 'amount_total' | 'currency' | 'metadata' | 'client_reference_id'
>;
export type ChargeFacts = Pick<Stripe.Charge, 'id' | 'payment_intent' | 'amount' | 'amount_refunded' | 'refunded'>;

/** What changed: the caller sends a receipt for 'paid' and a notice for 'refunded', once, after commit. */
export type Settled =
	| { change: 'paid'; paymentId: number }
	| { change: 'refunded'; paymentId: number }
	| { change: 'paid-then-refunded'; paymentId: number }
	| { change: 'partly-refunded'; paymentId: number }
	| { change: 'cancelled'; paymentId: number }
	| { change: 'none'; reason: string };

const idOf = (ref: string | { id: string } | null | undefined) => (typeof ref === 'string' ? ref : (ref?.id ?? null));

/**
 * One payment at a time: the webhook, the success page and an admin refund can all touch the same payment, and a
 * refund that overtakes its completion must be seen by it, so each takes this lock (released at commit).
 */
async function lockPayment(tx: Tx, key: string): Promise<void> {
	await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${`stopwise-payment:${key}`}))`);
}

export async function settleSessionPaid(tx: Tx, session: SessionFacts): Promise<Settled> {
	if (session.payment_status !== 'paid') return { change: 'none', reason: `session is ${session.payment_status}` };
	const intent = idOf(session.payment_intent);
	await lockPayment(tx, intent ?? session.id);
	const payment = (await findBySession(tx, session.id)) ?? (await adoptSession(tx, session));
	if (!payment) return { change: 'none', reason: 'session names no known learner and course' };
	if (payment.status === 'paid' || payment.status === 'refunded') return { change: 'none', reason: `already ${payment.status}` };
	await lockEnrolment(tx, payment.userId, payment.courseId);

	const early = intent ? await refundsSeenFor(tx, intent) : { cents: 0, full: false };
	const amount = session.amount_total ?? payment.amountCents;
	const full = early.full || (early.cents > 0 && early.cents >= amount);
	await tx
		.update(payments)
		.set({
			status: full ? 'refunded' : 'paid',
			paymentIntentId: intent,
			amountCents: amount,
			refundedCents: early.cents,
			paidAt: sql`now()`,
			refundedAt: full ? sql`now()` : null
		})
		.where(eq(payments.id, payment.id));
	// a refund that arrived first wins: no access is opened for money already returned
	if (full) return { change: 'paid-then-refunded', paymentId: payment.id };
	await activateEnrolment(tx, { userId: payment.userId, courseId: payment.courseId, source: 'payment', paymentId: payment.id });
	return { change: 'paid', paymentId: payment.id };
}

export async function settleChargeRefunded(tx: Tx, charge: ChargeFacts): Promise<Settled> {
	const intent = idOf(charge.payment_intent);
	if (!intent) return { change: 'none', reason: 'charge has no payment intent' };
	await lockPayment(tx, intent);
	const [payment] = await tx.select().from(payments).where(eq(payments.paymentIntentId, intent)).for('update');
	// not completed yet: the stored event is found by settleSessionPaid when the completion comes
	if (!payment) return { change: 'none', reason: 'no completed payment for this intent yet' };
	// events can arrive in any order: the refunded total only ever grows
	const refundedCents = Math.max(payment.refundedCents, charge.amount_refunded);
	const full = charge.refunded || refundedCents >= payment.amountCents;
	if (full && payment.status !== 'refunded') {
		await lockEnrolment(tx, payment.userId, payment.courseId);
		await tx
			.update(payments)
			.set({ status: 'refunded', refundedCents, refundedAt: sql`now()` })
			.where(eq(payments.id, payment.id));
		// another paid payment for the same course (or an admin's grant) keeps the learner's access
		await revokeUnlessStillPaid(tx, payment);
		return { change: 'refunded', paymentId: payment.id };
	}
	if (refundedCents !== payment.refundedCents) {
		await tx.update(payments).set({ refundedCents }).where(eq(payments.id, payment.id));
		return { change: 'partly-refunded', paymentId: payment.id };
	}
	return { change: 'none', reason: 'refund already applied' };
}

export async function settleSessionExpired(tx: Tx, session: Pick<SessionFacts, 'id'>): Promise<Settled> {
	await lockPayment(tx, session.id);
	const rows = await tx
		.update(payments)
		.set({ status: 'cancelled' })
		.where(and(eq(payments.checkoutSessionId, session.id), eq(payments.status, 'pending')))
		.returning({ id: payments.id });
	return rows[0] ? { change: 'cancelled', paymentId: rows[0].id } : { change: 'none', reason: 'not pending' };
}

async function findBySession(tx: Tx, sessionId: string): Promise<Payment | undefined> {
	const [row] = await tx.select().from(payments).where(eq(payments.checkoutSessionId, sessionId)).for('update');
	return row;
}

/** A paid session with no row (the row's insert failed after the session was made): rebuild it from the metadata. */
async function adoptSession(tx: Tx, session: SessionFacts): Promise<Payment | undefined> {
	const userId = session.metadata?.userId ?? session.client_reference_id;
	const courseId = Number(session.metadata?.courseId);
	if (!userId || !Number.isInteger(courseId)) return undefined;
	const [user] = await tx.select({ id: users.id }).from(users).where(eq(users.id, userId));
	const [course] = await tx.select({ id: courses.id }).from(courses).where(eq(courses.id, courseId));
	if (!user || !course) return undefined;
	const [row] = await tx
		.insert(payments)
		.values({
			userId,
			courseId,
			checkoutSessionId: session.id,
			amountCents: session.amount_total ?? 0,
			currency: session.currency ?? 'usd',
			couponCode: session.metadata?.coupon || null
		})
		.onConflictDoNothing()
		.returning();
	return row ?? (await findBySession(tx, session.id));
}

/** Refunds already received for an intent (stored charge.refunded events): the largest total, and whether any was full. */
async function refundsSeenFor(tx: Tx, intent: string): Promise<{ cents: number; full: boolean }> {
	const charge = sql`${webhookEvents.payload} -> 'data' -> 'object'`;
	const [row] = await tx
		.select({
			cents: sql<number>`coalesce(max((${charge} ->> 'amount_refunded')::int), 0)::int`,
			full: sql<boolean>`coalesce(bool_or((${charge} ->> 'refunded')::boolean), false)`
		})
		.from(webhookEvents)
		.where(and(eq(webhookEvents.type, 'charge.refunded'), sql`${charge} ->> 'payment_intent' = ${intent}`));
	return { cents: row?.cents ?? 0, full: row?.full ?? false };
}

// Paying for a field-day seat through the same provider, checkout and signed webhook as enrolment (metadata kind "field-day").
import { eq } from 'drizzle-orm';
import type Stripe from 'stripe';
import type { AuthUser } from '../auth';
import { db } from '../db';
import { fieldDayBookings, fieldDays } from '../db/schema';
import type { Tx } from '../payments/enrolments';
import { getStripe, isStripeError } from '../payments/stripe';
import { runFollowUps, type FollowUp } from './follow-ups';
import { lockFieldDay, markBooked, offerFreedSeats, takenSeats } from './seats';

export const FIELD_DAY_KIND = 'field-day';

type SessionFacts = Pick<Stripe.Checkout.Session, 'id' | 'payment_status' | 'payment_intent' | 'amount_total' | 'metadata' | 'status'>;

export function isFieldDaySession(session: { metadata?: Stripe.Metadata | null }): boolean {
	return session.metadata?.kind === FIELD_DAY_KIND;
}

const unreachable = 'We could not reach the payment service just now. Nothing was charged and your seat was let go; please try again in a minute.';

export type Opened = { ok: true; url: string } | { ok: false; status: number; message: string };

/** A Checkout Session for a held seat (or the one already open for it). */
export async function openFieldDayCheckout(user: AuthUser, bookingId: number, existingSessionId: string | null, origin: string): Promise<Opened> {
	const stripe = getStripe();
	if (!stripe) {
		console.error('[field-days] STRIPE_SECRET_KEY is not set: a paid field day cannot start a checkout');
		return { ok: false, status: 503, message: 'Payments are not set up on this server yet. Please try again later.' };
	}
	const [found] = await db.select({ booking: fieldDayBookings, day: fieldDays }).from(fieldDayBookings).innerJoin(fieldDays, eq(fieldDays.id, fieldDayBookings.fieldDayId)).where(eq(fieldDayBookings.id, bookingId));
	if (!found) return { ok: false, status: 404, message: 'There is no such booking.' };
	const { booking, day } = found;
	try {
		if (existingSessionId) {
			const open = await stripe.checkout.sessions.retrieve(existingSessionId);
			if (open.status === 'open' && open.url) return { ok: true, url: open.url };
		}
		const metadata = { kind: FIELD_DAY_KIND, bookingId: String(booking.id), fieldDayId: String(day.id), userId: user.id };
		const session = await stripe.checkout.sessions.create({
			mode: 'payment',
			line_items: [{ price_data: { currency: day.currency, unit_amount: day.priceCents, product_data: { name: `Field day: ${day.title}` } }, quantity: 1 }],
			customer_email: user.email,
			client_reference_id: user.id,
			metadata,
			payment_intent_data: { metadata, description: `Stopwise field day: ${day.title}` },
			success_url: `${origin}/field-days/${day.slug}?paid={CHECKOUT_SESSION_ID}`,
			cancel_url: `${origin}/field-days/${day.slug}?checkout=cancelled`
		});
		if (!session.url) throw new Error(`session ${session.id} came back without a payment page URL`);
		await db.update(fieldDayBookings).set({ checkoutSessionId: session.id, amountCents: day.priceCents }).where(eq(fieldDayBookings.id, booking.id));
		return { ok: true, url: session.url };
	} catch (e) {
		console.error('[field-days] could not start a checkout', isStripeError(e) ? `${e.type} ${e.statusCode}: ${e.message}` : e);
		return { ok: false, status: 502, message: unreachable };
	}
}

/** The checkout could not start: the held seat goes back (and to the next person waiting). */
export async function releaseFailedHold(bookingId: number, origin: string, now: Date): Promise<void> {
	const followUps = await db.transaction(async (tx) => {
		const [row] = await tx.select().from(fieldDayBookings).where(eq(fieldDayBookings.id, bookingId));
		if (!row) return [];
		const day = await lockFieldDay(tx, row.fieldDayId);
		const released = await tx
			.update(fieldDayBookings)
			.set({ status: 'cancelled', cancelledAt: now, holdUntil: null, updatedAt: now })
			.where(eq(fieldDayBookings.id, bookingId))
			.returning({ id: fieldDayBookings.id });
		if (!day || released.length === 0) return [];
		return (await offerFreedSeats(tx, day, now)).map((o): FollowUp => ({ kind: 'offer', bookingId: o.bookingId, until: o.until }));
	});
	await runFollowUps(followUps, origin);
}

export type FieldDaySettled = { change: 'field-day'; followUps: FollowUp[]; reason: string };

/**
 * A paid session books the held seat, idempotently (the webhook and the success page both call it). A payment that
 * arrives after its hold ran out still books the seat when one is free; if none is, it is refunded in full.
 */
export async function settleFieldDaySession(tx: Tx, session: SessionFacts, now = new Date()): Promise<FieldDaySettled> {
	const bookingId = Number(session.metadata?.bookingId);
	const none = (reason: string): FieldDaySettled => ({ change: 'field-day', followUps: [], reason });
	if (!Number.isInteger(bookingId)) return none('session names no booking');
	const [first] = await tx.select().from(fieldDayBookings).where(eq(fieldDayBookings.id, bookingId));
	if (!first) return none('no such booking');
	const day = await lockFieldDay(tx, first.fieldDayId);
	const [row] = await tx.select().from(fieldDayBookings).where(eq(fieldDayBookings.id, bookingId)).for('update');
	if (!day || !row || row.checkoutSessionId !== session.id) return none('session is not this booking\'s current checkout');

	if (session.payment_status !== 'paid') {
		if (session.status !== 'expired' || row.status !== 'held') return none(`session is ${session.status}/${session.payment_status}`);
		await tx.update(fieldDayBookings).set({ status: 'cancelled', cancelledAt: now, holdUntil: null, updatedAt: now }).where(eq(fieldDayBookings.id, row.id));
		const offers = await offerFreedSeats(tx, day, now);
		return { change: 'field-day', followUps: offers.map((o) => ({ kind: 'offer', bookingId: o.bookingId, until: o.until })), reason: 'checkout expired' };
	}
	if (row.status === 'booked') return none('already settled');
	const intent = typeof session.payment_intent === 'string' ? session.payment_intent : (session.payment_intent?.id ?? null);
	if (day.status === 'cancelled') {
		return intent ? { change: 'field-day', followUps: [{ kind: 'refund-late', bookingId: row.id, paymentIntentId: intent }], reason: 'paid after the day was called off: refunded' } : none('day called off');
	}
	// paid after the seat was let go (the hold ran out or the learner cancelled): booked if a seat is free, else refunded
	if (row.status !== 'held' && row.status !== 'offered' && day.seats - (await takenSeats(tx, day.id, now)) <= 0) {
		return intent ? { change: 'field-day', followUps: [{ kind: 'refund-late', bookingId: row.id, paymentIntentId: intent }], reason: 'paid too late: refunded' } : none('paid too late');
	}
	await markBooked(tx, row, now, session.amount_total ?? row.amountCents, intent);
	return { change: 'field-day', followUps: [{ kind: 'invite', bookingId: row.id }], reason: 'booked' };
}

/** The success page's side: settle a paid session now, so the seat never waits on the webhook. */
export async function confirmFieldDayPayment(user: AuthUser, sessionId: string, origin: string): Promise<'booked' | 'open' | 'missing'> {
	if (!/^cs_[A-Za-z0-9_]{1,250}$/.test(sessionId)) return 'missing';
	const stripe = getStripe();
	if (!stripe) return 'missing';
	try {
		const session = await stripe.checkout.sessions.retrieve(sessionId);
		if (!isFieldDaySession(session) || session.metadata?.userId !== user.id) return 'missing';
		if (session.payment_status !== 'paid') return 'open';
		const settled = await db.transaction((tx) => settleFieldDaySession(tx, session));
		await runFollowUps(settled.followUps, origin);
		return 'booked';
	} catch (e) {
		console.error('[field-days] could not confirm a payment', e instanceof Error ? e.message : e);
		return 'missing';
	}
}

/** Closes a held checkout at its time limit; a session paid meanwhile is settled instead. */
export async function closeHeldSession(sessionId: string, origin: string): Promise<'paid' | 'closed'> {
	const stripe = getStripe();
	if (!stripe) return 'closed';
	let session: Stripe.Checkout.Session;
	try {
		session = await stripe.checkout.sessions.expire(sessionId);
	} catch (e) {
		if (!(isStripeError(e) && e.statusCode === 400)) throw e;
		session = await stripe.checkout.sessions.retrieve(sessionId);
	}
	if (session.payment_status !== 'paid') return 'closed';
	const settled = await db.transaction((tx) => settleFieldDaySession(tx, session));
	await runFollowUps(settled.followUps, origin);
	return 'paid';
}

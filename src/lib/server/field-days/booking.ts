// Booking a seat, the waiting list, accepting an offered seat and cancelling: each one transaction under the field day's row lock.
import { and, eq, sql } from 'drizzle-orm';
import type { AuthUser } from '../auth';
import { db } from '../db';
import { fieldDayBookings, type FieldDay, type FieldDayBooking } from '../db/schema';
import { hasCourseAccess } from '../enrolment-access';
import type { Tx } from '../payments/enrolments';
import { getStripe, isStripeError } from '../payments/stripe';
import { refundableAt } from './refund-rule';
import { HOLD_MINUTES, lockFieldDay, markBooked, markCancelled, mustPay, offerFreedSeats, takenSeats, waitingPosition } from './seats';
import { runFollowUps, type FollowUp } from './follow-ups';
import { closeHeldSession, openFieldDayCheckout, releaseFailedHold } from './payment';

export type BookOutcome =
	| { kind: 'booked'; bookingId: number }
	| { kind: 'pay'; url: string }
	| { kind: 'waiting'; bookingId: number; position: number }
	| { kind: 'refused'; status: number; message: string };

const notOpen = (day: FieldDay, now: Date): string | null => {
	if (day.status === 'cancelled') return 'This field day has been called off.';
	if (day.startsAt.getTime() <= now.getTime()) return 'This field day has already started; bookings are closed.';
	return null;
};

async function ownRow(tx: Tx, fieldDayId: number, userId: string): Promise<FieldDayBooking | undefined> {
	const [row] = await tx
		.select()
		.from(fieldDayBookings)
		.where(and(eq(fieldDayBookings.fieldDayId, fieldDayId), eq(fieldDayBookings.userId, userId)))
		.for('update');
	return row;
}

const live = (row: FieldDayBooking, now: Date) =>
	row.status === 'booked' || row.status === 'waiting' || ((row.status === 'held' || row.status === 'offered') && (row.holdUntil?.getTime() ?? 0) > now.getTime());

type Taken =
	| { kind: 'booked'; bookingId: number; followUps: FollowUp[] }
	| { kind: 'held'; bookingId: number; until: Date }
	| { kind: 'waiting'; bookingId: number; position: number }
	| { kind: 'pay-again'; bookingId: number; sessionId: string | null }
	| { kind: 'refused'; status: number; message: string };

/**
 * Takes a seat when one is free (booked at once, or held for a checkout when the day is paid), else a place on the
 * waiting list. `acknowledged`: the learner ticked that they read the safety briefing; without it nothing is stored.
 */
export async function bookSeat(user: AuthUser, fieldDayId: number, acknowledged: boolean, origin: string, now = new Date()): Promise<BookOutcome> {
	if (!acknowledged) return { kind: 'refused', status: 400, message: 'Read the safety briefing and tick the box to say you have, then book.' };
	const taken = await db.transaction(async (tx): Promise<Taken> => {
		const day = await lockFieldDay(tx, fieldDayId);
		if (!day) return { kind: 'refused', status: 404, message: 'There is no such field day.' };
		const closed = notOpen(day, now);
		if (closed) return { kind: 'refused', status: 409, message: closed };
		if (day.includedWithEnrolment && !(await hasCourseAccess(user, day.courseId))) {
			return { kind: 'refused', status: 403, message: 'This field day comes with the course: enrol in the course first, then book your seat here.' };
		}
		const row = await ownRow(tx, day.id, user.id);
		if (row && live(row, now)) {
			if (row.status === 'booked') return { kind: 'booked', bookingId: row.id, followUps: [] };
			if (row.status === 'waiting') return { kind: 'waiting', bookingId: row.id, position: (await waitingPosition(tx, day.id, row.id)) ?? 1 };
			if (row.status === 'held') return { kind: 'pay-again', bookingId: row.id, sessionId: row.checkoutSessionId };
			// an offered seat is taken up by booking it
			return takeSeat(tx, day, row, now);
		}
		const free = day.seats - (await takenSeats(tx, day.id, now));
		const values = {
			briefingAcknowledgedAt: now,
			cancelledAt: null,
			holdUntil: null,
			updatedAt: now,
			status: 'waiting' as const,
			// the database's clock under the day's lock, not `now` taken before waiting for it: the queue's order is the
			// order in which requests got the lock, so a place told to one learner is never told to another
			waitingSince: sql`clock_timestamp()`
		};
		let target: FieldDayBooking;
		if (row) {
			[target] = await tx.update(fieldDayBookings).set(values).where(eq(fieldDayBookings.id, row.id)).returning();
		} else {
			[target] = await tx.insert(fieldDayBookings).values({ ...values, fieldDayId: day.id, userId: user.id }).returning();
		}
		if (free <= 0) return { kind: 'waiting', bookingId: target.id, position: (await waitingPosition(tx, day.id, target.id)) ?? 1 };
		return takeSeat(tx, day, target, now);
	});
	return finish(user, taken, origin, now);
}

/** A seat for `row`: booked now (nothing to pay) or held for a checkout. Under the lock, a seat known to be free. */
async function takeSeat(tx: Tx, day: FieldDay, row: FieldDayBooking, now: Date): Promise<Taken> {
	if (mustPay(day)) {
		const until = new Date(Math.max(now.getTime() + HOLD_MINUTES * 60_000, row.status === 'offered' ? (row.holdUntil?.getTime() ?? 0) : 0));
		await tx.update(fieldDayBookings).set({ status: 'held', holdUntil: until, updatedAt: now }).where(eq(fieldDayBookings.id, row.id));
		return { kind: 'held', bookingId: row.id, until };
	}
	await markBooked(tx, row, now, 0);
	return { kind: 'booked', bookingId: row.id, followUps: [{ kind: 'invite', bookingId: row.id }] };
}

async function finish(user: AuthUser, taken: Taken, origin: string, now: Date): Promise<BookOutcome> {
	switch (taken.kind) {
		case 'refused':
			return taken;
		case 'waiting':
			return { kind: 'waiting', bookingId: taken.bookingId, position: taken.position };
		case 'booked':
			await runFollowUps(taken.followUps, origin);
			return { kind: 'booked', bookingId: taken.bookingId };
		case 'held':
		case 'pay-again': {
			if (taken.kind === 'held') await runFollowUps([{ kind: 'hold', bookingId: taken.bookingId, until: taken.until }], origin);
			const opened = await openFieldDayCheckout(user, taken.bookingId, taken.kind === 'pay-again' ? taken.sessionId : null, origin);
			if (opened.ok) return { kind: 'pay', url: opened.url };
			if (taken.kind === 'held') await releaseFailedHold(taken.bookingId, origin, now);
			return { kind: 'refused', status: opened.status, message: opened.message };
		}
	}
}

export type CancelOutcome =
	| { ok: true; refundedCents: number; currency: string; was: FieldDayBooking['status'] }
	| { ok: false; status: number; message: string };

/**
 * Gives up a seat, a held checkout, an offer or a place in the queue. A paid seat cancelled before the refund deadline is
 * refunded at the provider first (nothing changes here if that fails); the freed seat is offered to the next in line.
 */
export async function cancelBooking(user: AuthUser, fieldDayId: number, origin: string, now = new Date()): Promise<CancelOutcome> {
	const [current] = await db
		.select()
		.from(fieldDayBookings)
		.where(and(eq(fieldDayBookings.fieldDayId, fieldDayId), eq(fieldDayBookings.userId, user.id)));
	if (!current || current.status === 'cancelled') return { ok: false, status: 404, message: 'You have no booking for this field day.' };

	const day = await db.query.fieldDays.findFirst({ where: (t, { eq }) => eq(t.id, fieldDayId) });
	if (!day) return { ok: false, status: 404, message: 'There is no such field day.' };
	let refundedCents = 0;
	if (current.status === 'booked' && current.amountCents > 0 && current.paymentIntentId) {
		if (refundableAt(day, now)) {
			const refunded = await refundAtProvider(current);
			if (!refunded.ok) return { ok: false, status: 502, message: refunded.message };
			refundedCents = current.amountCents;
		}
	}
	const result = await db.transaction(async (tx) => {
		const locked = await lockFieldDay(tx, fieldDayId);
		const row = await ownRow(tx, fieldDayId, user.id);
		if (!locked || !row || row.status === 'cancelled') return null;
		const wasBooked = row.status === 'booked';
		await markCancelled(tx, row, now, refundedCents);
		const offers = await offerFreedSeats(tx, locked, now);
		const followUps: FollowUp[] = offers.map((o) => ({ kind: 'offer', bookingId: o.bookingId, until: o.until }));
		if (wasBooked) followUps.unshift({ kind: 'cancelled', bookingId: row.id });
		if (row.status === 'held' && row.checkoutSessionId) followUps.push({ kind: 'expire-session', sessionId: row.checkoutSessionId });
		return { was: row.status, followUps };
	});
	if (!result) return { ok: false, status: 404, message: 'You have no booking for this field day.' };
	await runFollowUps(result.followUps, origin);
	return { ok: true, refundedCents, currency: day.currency, was: result.was };
}

export async function refundAtProvider(row: FieldDayBooking): Promise<{ ok: true } | { ok: false; message: string }> {
	const stripe = getStripe();
	if (!stripe) return { ok: false, message: 'Payments are not set up on this server, so the refund cannot be made now. Your seat is kept; try again later.' };
	try {
		await stripe.refunds.create(
			{ payment_intent: row.paymentIntentId!, reason: 'requested_by_customer', metadata: { fieldDayBookingId: String(row.id) } },
			// a double-submitted cancel is one refund
			{ idempotencyKey: `stopwise-field-day-refund-${row.id}-${row.paymentIntentId}` }
		);
		return { ok: true };
	} catch (e) {
		if (isStripeError(e) && e.code === 'charge_already_refunded') return { ok: true };
		console.error('[field-days] refund failed', isStripeError(e) ? `${e.type} ${e.statusCode}: ${e.message}` : e);
		return { ok: false, message: 'The payment service could not make the refund just now. Your seat is kept; try again in a minute.' };
	}
}

/**
 * The pg-boss job at a hold's time limit: an offer not taken up, or a checkout not paid, gives the seat to the next
 * person. A job for a hold that has since changed (paid, cancelled, extended) finds nothing to do.
 */
export async function expireSeatHold(bookingId: number, origin: string, now = new Date()): Promise<'expired' | 'nothing'> {
	const [first] = await db.select().from(fieldDayBookings).where(eq(fieldDayBookings.id, bookingId));
	if (!first || (first.status !== 'held' && first.status !== 'offered') || (first.holdUntil?.getTime() ?? 0) > now.getTime()) return 'nothing';
	// a checkout paid at the last minute wins: its session is closed (or found paid and settled) before the seat goes
	if (first.status === 'held' && first.checkoutSessionId) {
		if ((await closeHeldSession(first.checkoutSessionId, origin)) === 'paid') return 'nothing';
	}
	const followUps = await db.transaction(async (tx) => {
		const [row] = await tx.select().from(fieldDayBookings).where(eq(fieldDayBookings.id, bookingId));
		if (!row) return null;
		const day = await lockFieldDay(tx, row.fieldDayId);
		const [locked] = await tx.select().from(fieldDayBookings).where(eq(fieldDayBookings.id, bookingId)).for('update');
		if (!day || !locked || (locked.status !== 'held' && locked.status !== 'offered') || (locked.holdUntil?.getTime() ?? 0) > now.getTime()) return null;
		await tx
			.update(fieldDayBookings)
			.set({ status: 'cancelled', cancelledAt: now, holdUntil: null, waitingSince: null, updatedAt: now })
			.where(eq(fieldDayBookings.id, bookingId));
		const offers = await offerFreedSeats(tx, day, now);
		return offers.map((o): FollowUp => ({ kind: 'offer', bookingId: o.bookingId, until: o.until }));
	});
	if (!followUps) return 'nothing';
	await runFollowUps(followUps, origin);
	return 'expired';
}

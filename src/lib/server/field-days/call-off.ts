// Calling off a whole field day (weather, the venue, a mentor short): no new bookings from that moment, then every
// participant's booking is ended one by one, paid seats refunded in full whatever the deadline, and each person told why.
// A refund the provider refuses leaves that seat as it was; calling off again finishes the rest, and never refunds twice
// (the refund's idempotency key is the booking's own, shared with the learner's own cancellation).
import { and, eq, inArray } from 'drizzle-orm';
import { formatPrice } from '../../format';
import type { AuthUser } from '../auth';
import { recordAudit } from '../audit';
import { db } from '../db';
import { fieldDayBookings, fieldDays, type FieldDayBooking } from '../db/schema';
import { refundAtProvider } from './booking';
import { runFollowUps, whenText, type FollowUp } from './follow-ups';
import { lockFieldDay, markCancelled } from './seats';

export type CallOffOutcome =
	| { ok: true; told: number; refunded: number; refundsLeft: number }
	| { ok: false; status: 404 | 409; message: string };

const OPEN: FieldDayBooking['status'][] = ['booked', 'held', 'offered', 'waiting'];

/** Every place on the day not yet ended: seats, holds, offers and the waiting list. */
function openBookings(fieldDayId: number) {
	return db
		.select()
		.from(fieldDayBookings)
		.where(and(eq(fieldDayBookings.fieldDayId, fieldDayId), inArray(fieldDayBookings.status, OPEN)));
}

/** What a paid seat still has to get back. */
function owedCents(booking: FieldDayBooking): number {
	return booking.status === 'booked' && booking.paymentIntentId ? booking.amountCents - booking.refundedCents : 0;
}

export async function callOffFieldDay(actor: AuthUser, id: number, reason: string, origin: string, now = new Date()): Promise<CallOffOutcome> {
	const closed = await db.transaction(async (tx) => {
		const day = await lockFieldDay(tx, id);
		if (!day) return { ok: false, status: 404, message: 'There is no such field day.' } as const;
		if (day.endsAt.getTime() <= now.getTime()) return { ok: false, status: 409, message: 'This field day is over; there is nothing to call off.' } as const;
		if (day.status === 'scheduled') {
			await tx.update(fieldDays).set({ status: 'cancelled', calledOffAt: now, callOffReason: reason, updatedAt: now }).where(eq(fieldDays.id, id));
			await recordAudit(tx, actor, { action: 'field-day.call-off', subject: day.title, detail: reason, href: `/field-days/${day.slug}` });
		}
		return { ok: true } as const;
	});
	if (!closed.ok) return closed;

	const open = await openBookings(id);
	let told = 0;
	let refunded = 0;
	let refundsLeft = 0;
	for (const booking of open) {
		const owed = owedCents(booking);
		if (owed > 0) {
			if (!(await refundAtProvider(booking)).ok) {
				refundsLeft++;
				continue;
			}
			refunded++;
		}
		const followUps = await endBooking(id, booking.id, owed > 0 ? booking.amountCents : booking.refundedCents, now);
		if (followUps) {
			told++;
			await runFollowUps(followUps, origin);
		}
	}
	return { ok: true, told, refunded, refundsLeft };
}

/** Ends one booking under the day's lock (a payment settling at the same moment waits for it); null when it had ended. */
async function endBooking(fieldDayId: number, bookingId: number, refundedCents: number, now: Date): Promise<FollowUp[] | null> {
	return db.transaction(async (tx) => {
		if (!(await lockFieldDay(tx, fieldDayId))) return null;
		const [current] = await tx.select().from(fieldDayBookings).where(eq(fieldDayBookings.id, bookingId)).for('update');
		if (!current || !OPEN.includes(current.status)) return null;
		const hadSeat = current.status === 'booked';
		await markCancelled(tx, current, now, refundedCents);
		const followUps: FollowUp[] = [{ kind: 'called-off', bookingId, hadSeat }];
		if (current.status === 'held' && current.checkoutSessionId) followUps.push({ kind: 'expire-session', sessionId: current.checkoutSessionId });
		return followUps;
	});
}

/** What calling the day off would touch, for the author's confirmation page; null when there is no such day. */
export async function callOffSummary(id: number) {
	const [day] = await db.select().from(fieldDays).where(eq(fieldDays.id, id));
	if (!day) return null;
	const open = await openBookings(id);
	const seats = open.filter((b) => b.status === 'booked');
	const owed = seats.reduce((sum, b) => sum + owedCents(b), 0);
	return {
		title: day.title,
		slug: day.slug,
		when: whenText(day),
		over: day.endsAt.getTime() <= Date.now(),
		calledOff: day.status === 'cancelled' ? { reason: day.callOffReason ?? '', at: day.calledOffAt ? `${new Intl.DateTimeFormat('en', { dateStyle: 'long', timeStyle: 'short', timeZone: day.timeZone }).format(day.calledOffAt)} (${day.timeZone})` : null } : null,
		seats: seats.length,
		others: open.length - seats.length,
		refund: owed > 0 ? formatPrice(owed, day.currency) : null
	};
}

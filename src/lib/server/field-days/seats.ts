// Seats of one field day, counted under its row lock: who holds one, how many are free, and offers to the waiting list.
import { and, asc, eq, gt, inArray, or, sql } from 'drizzle-orm';
import { fieldDayBookings, fieldDays, type FieldDay, type FieldDayBooking } from '../db/schema';
import type { Tx } from '../payments/enrolments';

/** How long a freed seat is kept for the person it is offered to (STOPWISE_FIELD_DAY_OFFER_HOURS, default 24). */
export function offerHours(env: NodeJS.ProcessEnv = process.env): number {
	const hours = Number(env.STOPWISE_FIELD_DAY_OFFER_HOURS ?? 24);
	return Number.isFinite(hours) && hours > 0 ? hours : 24;
}

/** How long a seat waits for a checkout to be paid. */
export const HOLD_MINUTES = 30;

/**
 * Every change to a field day's seats takes this lock first (released at commit), so counting and taking a seat
 * are one step: twenty people asking for the last seat at once are served one after another.
 */
export async function lockFieldDay(tx: Tx, fieldDayId: number): Promise<FieldDay | undefined> {
	const [row] = await tx.select().from(fieldDays).where(eq(fieldDays.id, fieldDayId)).for('update');
	return row;
}

/** Seats taken: booked, or held for a checkout or an offer that has not run out. */
export async function takenSeats(tx: Tx, fieldDayId: number, now: Date): Promise<number> {
	const [row] = await tx
		.select({ n: sql<number>`count(*)::int` })
		.from(fieldDayBookings)
		.where(
			and(
				eq(fieldDayBookings.fieldDayId, fieldDayId),
				or(eq(fieldDayBookings.status, 'booked'), and(inArray(fieldDayBookings.status, ['held', 'offered']), gt(fieldDayBookings.holdUntil, now)))
			)
		);
	return row?.n ?? 0;
}

export type Offer = { bookingId: number; until: Date };

/** Offers each free seat to the next person waiting (longest first), with a time limit; call under the lock. */
export async function offerFreedSeats(tx: Tx, day: FieldDay, now: Date): Promise<Offer[]> {
	if (day.status !== 'scheduled' || day.startsAt.getTime() <= now.getTime()) return [];
	const free = day.seats - (await takenSeats(tx, day.id, now));
	if (free <= 0) return [];
	const next = await tx
		.select({ id: fieldDayBookings.id })
		.from(fieldDayBookings)
		.where(and(eq(fieldDayBookings.fieldDayId, day.id), eq(fieldDayBookings.status, 'waiting')))
		.orderBy(asc(fieldDayBookings.waitingSince), asc(fieldDayBookings.id))
		.limit(free);
	const until = new Date(Math.min(now.getTime() + offerHours() * 3_600_000, day.startsAt.getTime()));
	const offers: Offer[] = [];
	for (const { id } of next) {
		await tx.update(fieldDayBookings).set({ status: 'offered', holdUntil: until, updatedAt: now }).where(eq(fieldDayBookings.id, id));
		offers.push({ bookingId: id, until });
	}
	return offers;
}

/** The learner's place in the waiting list (1 = next), or null when not waiting. */
export async function waitingPosition(tx: Tx, fieldDayId: number, bookingId: number): Promise<number | null> {
	const rows = await tx
		.select({ id: fieldDayBookings.id })
		.from(fieldDayBookings)
		.where(and(eq(fieldDayBookings.fieldDayId, fieldDayId), eq(fieldDayBookings.status, 'waiting')))
		.orderBy(asc(fieldDayBookings.waitingSince), asc(fieldDayBookings.id));
	const i = rows.findIndex((r) => r.id === bookingId);
	return i < 0 ? null : i + 1;
}

/** Whether this person pays for a seat: a field day included with enrolment is free for the course's learners only. */
export function mustPay(day: Pick<FieldDay, 'priceCents' | 'includedWithEnrolment'>): boolean {
	return !day.includedWithEnrolment && day.priceCents > 0;
}

/** The seat is the learner's: a learner told of this event before (booked, then cancelled) gets a higher SEQUENCE. */
export async function markBooked(tx: Tx, row: Pick<FieldDayBooking, 'id' | 'bookedAt'>, now: Date, amountCents: number, paymentIntentId: string | null = null) {
	await tx
		.update(fieldDayBookings)
		.set({
			status: 'booked',
			holdUntil: null,
			waitingSince: null,
			bookedAt: now,
			cancelledAt: null,
			amountCents,
			refundedCents: 0,
			paymentIntentId,
			sequence: row.bookedAt ? sql`${fieldDayBookings.sequence} + 1` : sql`${fieldDayBookings.sequence}`,
			updatedAt: now
		})
		.where(eq(fieldDayBookings.id, row.id));
}


/** The place is given up (by the learner, or with the whole day); a seat's calendar event is dropped with a higher SEQUENCE. */
export async function markCancelled(tx: Tx, row: Pick<FieldDayBooking, 'id' | 'status' | 'refundedCents'>, now: Date, refundedCents: number) {
	await tx
		.update(fieldDayBookings)
		.set({
			status: 'cancelled',
			cancelledAt: now,
			holdUntil: null,
			waitingSince: null,
			refundedCents: Math.max(row.refundedCents, refundedCents),
			sequence: row.status === 'booked' ? sql`${fieldDayBookings.sequence} + 1` : sql`${fieldDayBookings.sequence}`,
			updatedAt: now
		})
		.where(eq(fieldDayBookings.id, row.id));
}

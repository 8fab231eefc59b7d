// What a booking change sets off once committed: e-mails (with calendar parts), hold-expiry jobs, a late payment refunded.
import { eq } from 'drizzle-orm';
import { formatPrice } from '../../format';
import { db } from '../db';
import { fieldDayBookings, fieldDays, users } from '../db/schema';
import { sendInBackground, sendLetter } from '../mail';
import { getStripe } from '../payments/stripe';
import { bookingInvitation } from './calendar';
import { scheduleSeatExpiry } from './jobs';
import { fieldDayCalledOffLetter, fieldDayChangedLetter, seatBookedLetter, seatCancelledLetter, seatOfferedLetter } from './letters';
import { mustPay } from './seats';

export type FollowUp =
	| { kind: 'invite'; bookingId: number }
	| { kind: 'changed'; bookingId: number }
	| { kind: 'cancelled'; bookingId: number }
	| { kind: 'called-off'; bookingId: number; hadSeat: boolean }
	| { kind: 'offer'; bookingId: number; until: Date }
	| { kind: 'hold'; bookingId: number; until: Date }
	| { kind: 'expire-session'; sessionId: string }
	| { kind: 'refund-late'; bookingId: number; paymentIntentId: string };

export function whenText(day: { startsAt: Date; endsAt: Date; timeZone: string }): string {
	const date = new Intl.DateTimeFormat('en', { dateStyle: 'full', timeZone: day.timeZone }).format(day.startsAt);
	const time = new Intl.DateTimeFormat('en', { timeStyle: 'short', timeZone: day.timeZone });
	return `${date}, ${time.format(day.startsAt)}–${time.format(day.endsAt)} (${day.timeZone})`;
}

async function facts(bookingId: number) {
	const [row] = await db
		.select({ booking: fieldDayBookings, day: fieldDays, email: users.email, name: users.name })
		.from(fieldDayBookings)
		.innerJoin(fieldDays, eq(fieldDays.id, fieldDayBookings.fieldDayId))
		.innerJoin(users, eq(users.id, fieldDayBookings.userId))
		.where(eq(fieldDayBookings.id, bookingId));
	return row ?? null;
}

async function mail(f: FollowUp, origin: string): Promise<void> {
	if (!('bookingId' in f) || f.kind === 'hold' || f.kind === 'refund-late') return;
	const found = await facts(f.bookingId);
	if (!found) return;
	const { booking, day, email, name } = found;
	const base = { title: day.title, when: whenText(day), meetingPoint: day.meetingPoint, href: `${origin}/field-days/${day.slug}` };
	const ics = () => bookingInvitation({ day, booking, attendee: { name, email }, origin }).content;
	if (f.kind === 'invite') await sendLetter(seatBookedLetter(email, name, { ...base, safetyBriefing: day.safetyBriefing, kitList: day.kitList }, ics()));
	else if (f.kind === 'changed') await sendLetter(fieldDayChangedLetter(email, name, base, ics()));
	else if (f.kind === 'cancelled') {
		const refunded = booking.refundedCents > 0 ? formatPrice(booking.refundedCents, day.currency) : null;
		await sendLetter(seatCancelledLetter(email, name, { ...base, refunded }, ics()));
	} else if (f.kind === 'called-off') {
		const refunded = booking.refundedCents > 0 ? formatPrice(booking.refundedCents, day.currency) : null;
		await sendLetter(fieldDayCalledOffLetter(email, name, { ...base, reason: day.callOffReason ?? '', refunded }, f.hadSeat ? ics() : null));
	} else if (f.kind === 'offer') {
		const until = `${new Intl.DateTimeFormat('en', { dateStyle: 'long', timeStyle: 'short', timeZone: day.timeZone }).format(f.until)} (${day.timeZone})`;
		await sendLetter(seatOfferedLetter(email, name, { ...base, until, pay: mustPay(day) ? formatPrice(day.priceCents, day.currency) : null }));
	}
}

/** Jobs and refunds are awaited (they must not be lost); e-mails go in the background, tracked for the tests. */
export async function runFollowUps(list: FollowUp[], origin: string): Promise<void> {
	for (const f of list) {
		if (f.kind === 'offer' || f.kind === 'hold') await scheduleSeatExpiry(f.bookingId, f.until);
		if (f.kind === 'expire-session') {
			await getStripe()
				?.checkout.sessions.expire(f.sessionId)
				.catch(() => undefined);
		}
		if (f.kind === 'refund-late') {
			await getStripe()
				?.refunds.create({ payment_intent: f.paymentIntentId, reason: 'requested_by_customer' }, { idempotencyKey: `stopwise-field-day-late-${f.bookingId}-${f.paymentIntentId}` })
				.catch((e: unknown) => console.error('[field-days] could not refund a late payment', f.paymentIntentId, e instanceof Error ? e.message : e));
		}
		sendInBackground(`field day ${f.kind}`, () => mail(f, origin));
	}
}

/** Where links in mail sent by jobs point: the app's public origin. */
export function publicOrigin(env: NodeJS.ProcessEnv = process.env): string {
	return (env.ORIGIN ?? `http://localhost:${env.PORT ?? '3000'}`).replace(/\/+$/, '');
}

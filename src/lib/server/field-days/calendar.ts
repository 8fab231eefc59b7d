// RFC 5545 calendars made with ical-generator: a booking's invitation or cancellation, and a learner's private feed.
import { and, eq, inArray } from 'drizzle-orm';
import ical, { ICalCalendarMethod, ICalEventStatus, type ICalCalendar } from 'ical-generator';
import { randomBytes } from 'node:crypto';
import { db } from '../db';
import { calendarFeeds, fieldDayBookings, fieldDays, users, type FieldDay, type FieldDayBooking } from '../db/schema';
import { mailFrom } from '../mail';
import { dueDatesFor } from '../cohorts/schedule';

const prodId = { company: 'Stopwise', product: 'Field days', language: 'EN' };

/** One learner's event for one field day: the booking row's id keeps the UID the same through every change. */
export function bookingUid(bookingId: number): string {
	return `field-day-booking-${bookingId}@stopwise`;
}

function organizer() {
	const m = /^(.*)<([^>]+)>\s*$/.exec(mailFrom);
	return m ? { name: m[1].trim() || 'Stopwise', email: m[2].trim() } : { name: 'Stopwise', email: mailFrom.trim() };
}

/** The text of the event: where, what to bring, and the safety briefing in full. */
export function eventDescription(day: Pick<FieldDay, 'meetingPoint' | 'kitList' | 'safetyBriefing' | 'timeZone' | 'startsAt'>, href: string): string {
	const local = new Intl.DateTimeFormat('en', { dateStyle: 'full', timeStyle: 'short', timeZone: day.timeZone }).format(day.startsAt);
	return [
		`Starts ${local} (${day.timeZone}).`,
		`Meeting point: ${day.meetingPoint}`,
		day.kitList ? `Bring: ${day.kitList}` : '',
		`Safety briefing: ${day.safetyBriefing}`,
		`Details and cancellation: ${href}`
	]
		.filter(Boolean)
		.join('\n\n');
}

type EventInput = { day: FieldDay; booking: Pick<FieldDayBooking, 'id' | 'sequence' | 'status'>; attendee?: { name: string; email: string }; origin: string };

function addEvent(cal: ICalCalendar, { day, booking, attendee, origin }: EventInput) {
	const href = `${origin}/field-days/${day.slug}`;
	const cancelled = booking.status !== 'booked' || day.status === 'cancelled';
	cal.createEvent({
		id: bookingUid(booking.id),
		sequence: booking.sequence,
		start: day.startsAt,
		end: day.endsAt,
		summary: `Field day: ${day.title}`,
		description: eventDescription(day, href),
		location: day.latitude !== null && day.longitude !== null ? { title: day.meetingPoint, geo: { lat: day.latitude, lon: day.longitude } } : day.meetingPoint,
		url: href,
		status: cancelled ? ICalEventStatus.CANCELLED : ICalEventStatus.CONFIRMED,
		organizer: organizer(),
		attendees: attendee ? [{ name: attendee.name, email: attendee.email, rsvp: false }] : []
	});
}

/** The `.ics` attached to a booking e-mail: METHOD:REQUEST for a seat, METHOD:CANCEL once it is given up. */
export function bookingInvitation(input: EventInput): { method: 'REQUEST' | 'CANCEL'; content: string } {
	const cancelled = input.booking.status !== 'booked' || input.day.status === 'cancelled';
	const method = cancelled ? ICalCalendarMethod.CANCEL : ICalCalendarMethod.REQUEST;
	const cal = ical({ prodId, method, name: 'Stopwise field day' });
	addEvent(cal, input);
	return { method: cancelled ? 'CANCEL' : 'REQUEST', content: cal.toString() };
}

/** The learner's private feed: every field day they booked, those they gave up as cancelled (so calendars drop them), and their cohorts' due dates. */
export async function learnerFeed(userId: string, origin: string): Promise<string> {
	const rows = await db
		.select({ booking: fieldDayBookings, day: fieldDays })
		.from(fieldDayBookings)
		.innerJoin(fieldDays, eq(fieldDays.id, fieldDayBookings.fieldDayId))
		.where(and(eq(fieldDayBookings.userId, userId), inArray(fieldDayBookings.status, ['booked', 'cancelled'])));
	const cal = ical({ prodId, method: ICalCalendarMethod.PUBLISH, name: 'Stopwise: my field days' });
	// a booking cancelled before it was ever booked was never in the calendar
	for (const { booking, day } of rows) if (booking.status === 'booked' || booking.bookedAt) addEvent(cal, { day, booking, origin });
	// the due dates of the learner's cohorts, as a short event at the deadline
	for (const due of await dueDatesFor(userId)) {
		cal.createEvent({
			id: `cohort-${due.cohortId}-due-${due.assignmentId}@stopwise`,
			start: due.dueAt,
			end: due.dueAt,
			summary: `Due: ${due.assignment}`,
			description: `Your cohort “${due.cohort}” sends “${due.assignment}” by now.`,
			url: `${origin}/cohort`
		});
	}
	return cal.toString();
}

/** The feed's secret, made on first use. */
export async function feedToken(userId: string): Promise<string> {
	const [found] = await db.select({ token: calendarFeeds.token }).from(calendarFeeds).where(eq(calendarFeeds.userId, userId));
	if (found) return found.token;
	const token = randomBytes(24).toString('base64url');
	await db.insert(calendarFeeds).values({ userId, token }).onConflictDoNothing();
	const [row] = await db.select({ token: calendarFeeds.token }).from(calendarFeeds).where(eq(calendarFeeds.userId, userId));
	return row!.token;
}

/** A new secret: the old address stops working. */
export async function resetFeedToken(userId: string): Promise<string> {
	const token = randomBytes(24).toString('base64url');
	await db.insert(calendarFeeds).values({ userId, token }).onConflictDoUpdate({ target: calendarFeeds.userId, set: { token, createdAt: new Date() } });
	return token;
}

/** Whose feed a secret opens (null for an unknown or malformed one). */
export async function feedOwner(token: string): Promise<string | null> {
	if (!/^[A-Za-z0-9_-]{32}$/.test(token)) return null;
	const [row] = await db.select({ userId: calendarFeeds.userId }).from(calendarFeeds).innerJoin(users, eq(users.id, calendarFeeds.userId)).where(eq(calendarFeeds.token, token));
	return row?.userId ?? null;
}

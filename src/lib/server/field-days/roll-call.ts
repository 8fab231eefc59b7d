// On the day: the mentor's roll call (who came, who acknowledged the safety briefing) and the participant's own acknowledgement.
import { and, asc, eq, gt, sql } from 'drizzle-orm';
import type { AuthUser } from '../auth';
import { db } from '../db';
import { fieldDayBookings, fieldDays, users, type FieldDay } from '../db/schema';
import { whenText } from './follow-ups';

/** From this long before the start until the end, participants may acknowledge the briefing "on the day". */
export const ON_THE_DAY_HOURS = 12;

export function isOnTheDay(day: Pick<FieldDay, 'startsAt' | 'endsAt'>, now = new Date()): boolean {
	return now.getTime() >= day.startsAt.getTime() - ON_THE_DAY_HOURS * 3_600_000 && now.getTime() <= day.endsAt.getTime();
}

/** Mentors on duty for the day, and admins, keep its roll call. */
export function keepsRollCall(user: Pick<AuthUser, 'id' | 'roles'>, day: Pick<FieldDay, 'mentorIds'>): boolean {
	return user.roles.includes('admin') || (user.roles.includes('mentor') && day.mentorIds.includes(user.id));
}

/** The days a mentor is on duty for (admins: all), from yesterday on. */
export async function dutyDays(user: Pick<AuthUser, 'id' | 'roles'>) {
	const since = new Date(Date.now() - 86_400_000);
	const onDuty = user.roles.includes('admin') ? undefined : sql`${user.id} = any(${fieldDays.mentorIds})`;
	const rows = await db.select().from(fieldDays).where(and(gt(fieldDays.endsAt, since), onDuty)).orderBy(asc(fieldDays.startsAt));
	return rows.map((d) => ({ slug: d.slug, title: d.title, when: whenText(d) }));
}

export type RollCall =
	| { ok: true; day: { slug: string; title: string; when: string; safetyBriefing: string }; participants: Participant[] }
	| { ok: false; status: 403 | 404; message: string };
export type Participant = { bookingId: number; name: string; acknowledgedAt: string | null; onDayAt: string | null; came: boolean };

const time = (d: Date | null, tz: string) => (d ? new Intl.DateTimeFormat('en', { dateStyle: 'medium', timeStyle: 'short', timeZone: tz }).format(d) : null);

export async function readRollCall(user: AuthUser, slug: string): Promise<RollCall> {
	const day = await db.query.fieldDays.findFirst({ where: eq(fieldDays.slug, slug) });
	if (!day) return { ok: false, status: 404, message: 'There is no such field day.' };
	if (!keepsRollCall(user, day)) return { ok: false, status: 403, message: 'Only the mentors on duty for this day keep its roll call.' };
	const rows = await db
		.select({ booking: fieldDayBookings, name: users.name })
		.from(fieldDayBookings)
		.innerJoin(users, eq(users.id, fieldDayBookings.userId))
		.where(and(eq(fieldDayBookings.fieldDayId, day.id), eq(fieldDayBookings.status, 'booked')))
		.orderBy(asc(users.name));
	return {
		ok: true,
		day: { slug: day.slug, title: day.title, when: whenText(day), safetyBriefing: day.safetyBriefing },
		participants: rows.map(({ booking, name }) => ({
			bookingId: booking.id,
			name,
			acknowledgedAt: time(booking.briefingAcknowledgedAt, day.timeZone),
			onDayAt: time(booking.briefingOnDayAt, day.timeZone),
			came: booking.attendedAt !== null
		}))
	};
}

export async function markAttendance(user: AuthUser, slug: string, bookingId: number, came: boolean): Promise<{ ok: true } | { ok: false; status: 403 | 404; message: string }> {
	const day = await db.query.fieldDays.findFirst({ where: eq(fieldDays.slug, slug) });
	if (!day) return { ok: false, status: 404, message: 'There is no such field day.' };
	if (!keepsRollCall(user, day)) return { ok: false, status: 403, message: 'Only the mentors on duty for this day keep its roll call.' };
	const changed = await db
		.update(fieldDayBookings)
		.set({ attendedAt: came ? new Date() : null, updatedAt: new Date() })
		.where(and(eq(fieldDayBookings.id, bookingId), eq(fieldDayBookings.fieldDayId, day.id), eq(fieldDayBookings.status, 'booked')))
		.returning({ id: fieldDayBookings.id });
	return changed.length ? { ok: true } : { ok: false, status: 404, message: 'That person has no seat on this day.' };
}

/** The participant confirms, at the venue, that they heard the briefing; only with a seat, and only on the day. */
export async function acknowledgeOnDay(user: AuthUser, fieldDayId: number, now = new Date()): Promise<{ ok: true } | { ok: false; status: number; message: string }> {
	const day = await db.query.fieldDays.findFirst({ where: eq(fieldDays.id, fieldDayId) });
	if (!day) return { ok: false, status: 404, message: 'There is no such field day.' };
	if (!isOnTheDay(day, now)) return { ok: false, status: 409, message: 'The briefing is acknowledged on the day itself, at the venue.' };
	const done = await db
		.update(fieldDayBookings)
		.set({ briefingOnDayAt: now, updatedAt: now })
		.where(and(eq(fieldDayBookings.fieldDayId, day.id), eq(fieldDayBookings.userId, user.id), eq(fieldDayBookings.status, 'booked')))
		.returning({ id: fieldDayBookings.id });
	return done.length ? { ok: true } : { ok: false, status: 404, message: 'You have no seat on this day.' };
}

// Field days as pages read them: the list of upcoming days with seats left, one day with the visitor's own booking.
import { and, asc, eq, gt, inArray, or, sql } from 'drizzle-orm';
import { formatPrice } from '../../format';
import { db } from '../db';
import { assignments, courses, fieldDayBookings, fieldDays, lessons, type FieldDay } from '../db/schema';
import { decideAccess, type Viewer } from '../lessons/access';
import { isOnTheDay } from './roll-call';
import { refundDeadline, refundRuleText } from './refund-rule';
import { mustPay, waitingPosition } from './seats';
import { whenText } from './follow-ups';
import { instantToZoned } from './zoned-time';
import { assignmentPath } from '$lib/attempts/paths';

const takenSql = sql<number>`(select count(*)::int from ${fieldDayBookings} b where b.field_day_id = ${fieldDays.id} and (b.status = 'booked' or (b.status in ('held', 'offered') and b.hold_until > now())))`;

export type FieldDayCard = { slug: string; title: string; summary: string; when: string; meetingPoint: string; seatsLeft: number; seats: number; price: string; status: FieldDay['status'] };

function priceText(day: Pick<FieldDay, 'priceCents' | 'currency' | 'includedWithEnrolment'>): string {
	if (day.includedWithEnrolment) return 'Included with enrolment';
	return day.priceCents > 0 ? formatPrice(day.priceCents, day.currency) : 'Free';
}

export async function listFieldDays(options: { upcomingOnly?: boolean } = {}): Promise<FieldDayCard[]> {
	const rows = await db
		.select({ day: fieldDays, taken: takenSql })
		.from(fieldDays)
		.where(options.upcomingOnly === false ? undefined : gt(fieldDays.endsAt, new Date()))
		.orderBy(asc(fieldDays.startsAt));
	return rows.map(({ day, taken }) => ({
		slug: day.slug,
		title: day.title,
		summary: day.summary,
		when: whenText(day),
		meetingPoint: day.meetingPoint,
		seats: day.seats,
		seatsLeft: Math.max(0, day.seats - taken),
		price: priceText(day),
		status: day.status
	}));
}

/** The page of one field day for `viewer`; the upload link is offered only to those the lesson rule lets upload. */
export async function fieldDayPage(slug: string, viewer: NonNullable<Viewer>) {
	const userId = viewer.id;
	const [found] = await db
		.select({ day: fieldDays, taken: takenSql, course: { id: courses.id, slug: courses.slug, title: courses.title } })
		.from(fieldDays)
		.innerJoin(courses, eq(courses.id, fieldDays.courseId))
		.where(eq(fieldDays.slug, slug));
	if (!found) return null;
	const { day, taken, course } = found;
	const [own] = await db.select().from(fieldDayBookings).where(and(eq(fieldDayBookings.fieldDayId, day.id), eq(fieldDayBookings.userId, userId)));
	const waiting = await db
		.select({ n: sql<number>`count(*)::int` })
		.from(fieldDayBookings)
		.where(and(eq(fieldDayBookings.fieldDayId, day.id), eq(fieldDayBookings.status, 'waiting')));
	const paid = mustPay(day);
	// the day's Assignment through the normal attempt path: its upload page under the lesson
	const [upload] = day.assignmentId
		? await db
				.select({ lesson: lessons.slug, slug: assignments.slug, title: assignments.title })
				.from(assignments)
				.innerJoin(lessons, eq(lessons.id, assignments.lessonId))
				.where(eq(assignments.id, day.assignmentId))
		: [];
	// the same rule as the upload page itself (an Assignment is never free), so the link never leads to a refusal
	const mayUpload = upload ? (await decideAccess(viewer, { courseId: course.id, courseSlug: course.slug, free: false })) === 'open' : false;
	const holdLive = own?.holdUntil ? own.holdUntil.getTime() > Date.now() : false;
	const status = !own ? 'none' : (own.status === 'held' || own.status === 'offered') && !holdLive ? 'cancelled' : own.status;
	return {
		id: day.id,
		slug: day.slug,
		title: day.title,
		summary: day.summary,
		course: { slug: course.slug, title: course.title },
		when: whenText(day),
		startsAtIso: day.startsAt.toISOString(),
		timeZone: day.timeZone,
		meetingPoint: day.meetingPoint,
		map: day.latitude !== null && day.longitude !== null ? { lat: day.latitude, lon: day.longitude } : null,
		seats: day.seats,
		seatsLeft: Math.max(0, day.seats - taken),
		waitingCount: waiting[0]?.n ?? 0,
		price: priceText(day),
		paid,
		refundRule: refundRuleText(day, paid),
		refundDeadline: paid ? whenText({ startsAt: refundDeadline(day), endsAt: refundDeadline(day), timeZone: day.timeZone }).replace(/–.*? \(/, ' (') : null,
		kitList: day.kitList,
		safetyBriefing: day.safetyBriefing,
		dayStatus: day.status,
		calledOff: calledOffText(day),
		started: day.startsAt.getTime() <= Date.now(),
		onTheDay: isOnTheDay(day),
		upload: upload ? { title: upload.title, href: assignmentPath(course.slug, upload.lesson, upload.slug), allowed: mayUpload } : null,
		booking: own
			? {
					status,
					holdUntil: holdLive && own.holdUntil ? whenText({ startsAt: own.holdUntil, endsAt: own.holdUntil, timeZone: day.timeZone }).replace(/–.*? \(/, ' (') : null,
					position: own.status === 'waiting' ? await db.transaction((tx) => waitingPosition(tx, day.id, own.id)) : null,
					acknowledged: own.briefingAcknowledgedAt !== null,
					acknowledgedOnDay: own.briefingOnDayAt !== null,
					refunded: own.refundedCents > 0 ? formatPrice(own.refundedCents, day.currency) : null
				}
			: null
	};
}

/** Why a day was called off, for the author's pages and the day's own page; null while it stands. */
export function calledOffText(day: Pick<FieldDay, 'status' | 'callOffReason'>): string | null {
	return day.status === 'cancelled' ? day.callOffReason || 'No reason was given.' : null;
}

/** For the edit page: the stored day as the form's fields, and why it was called off (null while it stands). */
export async function fieldDayForEditing(id: number) {
	const [row] = await db.select({ day: fieldDays, courseSlug: courses.slug }).from(fieldDays).innerJoin(courses, eq(courses.id, fieldDays.courseId)).where(eq(fieldDays.id, id));
	if (!row) return null;
	const { day } = row;
	const assignment = day.assignmentId ? await db.query.assignments.findFirst({ where: (t, { eq }) => eq(t.id, day.assignmentId!) }) : null;
	const mentors = day.mentorIds.length ? await db.query.users.findMany({ where: (t, { inArray }) => inArray(t.id, day.mentorIds) }) : [];
	const values = {
		title: day.title,
		slug: day.slug,
		summary: day.summary,
		courseSlug: row.courseSlug,
		assignmentSlug: assignment?.slug ?? '',
		startsAt: instantToZoned(day.startsAt, day.timeZone),
		endsAt: instantToZoned(day.endsAt, day.timeZone),
		timeZone: day.timeZone,
		meetingPoint: day.meetingPoint,
		latitude: day.latitude === null ? '' : String(day.latitude),
		longitude: day.longitude === null ? '' : String(day.longitude),
		seats: day.seats,
		price: (day.priceCents / 100).toFixed(2),
		includedWithEnrolment: day.includedWithEnrolment,
		refundHours: day.refundHours,
		kitList: day.kitList,
		safetyBriefing: day.safetyBriefing,
		mentorEmails: mentors.map((m) => m.email).join(', ')
	};
	return { values, calledOff: calledOffText(day) };
}

/** The learner's own field days, for the account page and the feed. */
export async function myFieldDays(userId: string) {
	const rows = await db
		.select({ day: fieldDays, booking: fieldDayBookings })
		.from(fieldDayBookings)
		.innerJoin(fieldDays, eq(fieldDays.id, fieldDayBookings.fieldDayId))
		.where(and(eq(fieldDayBookings.userId, userId), or(inArray(fieldDayBookings.status, ['booked', 'waiting']), gt(fieldDayBookings.holdUntil, new Date()))))
		.orderBy(asc(fieldDays.startsAt));
	return rows.map(({ day, booking }) => ({ slug: day.slug, title: day.title, when: whenText(day), status: booking.status }));
}

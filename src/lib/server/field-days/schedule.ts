// Scheduling and changing a field day (authors and admins), audited; a change raises every booked learner's SEQUENCE and mails the update.
import { and, arrayContains, eq, inArray, sql } from 'drizzle-orm';
import type { AuthUser } from '../auth';
import { recordAudit } from '../audit';
import { db } from '../db';
import { assignments, courses, fieldDayBookings, fieldDays, users, type FieldDay } from '../db/schema';
import type { FieldDayForm } from '$lib/forms/field-days';
import { runFollowUps, type FollowUp } from './follow-ups';
import { zonedToInstant } from './zoned-time';

export type ScheduleResult = { ok: true; slug: string } | { ok: false; field?: keyof FieldDayForm; message: string };

async function resolve(form: FieldDayForm) {
	const course = await db.query.courses.findFirst({ where: eq(courses.slug, form.courseSlug) });
	if (!course) return { ok: false, field: 'courseSlug', message: 'There is no course with that address.' } as const;
	let assignmentId: number | null = null;
	if (form.assignmentSlug) {
		const found = await db.query.assignments.findFirst({ where: eq(assignments.slug, form.assignmentSlug) });
		if (!found) return { ok: false, field: 'assignmentSlug', message: 'There is no Assignment with that address.' } as const;
		assignmentId = found.id;
	}
	const emails = [...new Set(form.mentorEmails.split(/[\s,;]+/).map((e) => e.trim().toLowerCase()).filter(Boolean))];
	const mentors = emails.length
		? await db.select({ id: users.id, email: users.email }).from(users).where(and(inArray(users.email, emails), arrayContains(users.roles, ['mentor'])))
		: [];
	const unknown = emails.filter((e) => !mentors.some((m) => m.email === e));
	if (unknown.length) return { ok: false, field: 'mentorEmails', message: `Not a mentor here: ${unknown.join(', ')}.` } as const;
	const startsAt = zonedToInstant(form.startsAt, form.timeZone);
	const endsAt = zonedToInstant(form.endsAt, form.timeZone);
	const values = {
		slug: form.slug,
		courseId: course.id,
		assignmentId,
		title: form.title,
		summary: form.summary,
		startsAt,
		endsAt,
		timeZone: form.timeZone,
		meetingPoint: form.meetingPoint,
		latitude: form.latitude === '' ? null : Number(form.latitude),
		longitude: form.longitude === '' ? null : Number(form.longitude),
		seats: form.seats,
		priceCents: Math.round(Number(form.price) * 100),
		currency: course.currency,
		includedWithEnrolment: form.includedWithEnrolment,
		refundHours: form.refundHours,
		kitList: form.kitList,
		safetyBriefing: form.safetyBriefing,
		mentorIds: mentors.map((m) => m.id)
	};
	return { ok: true, values } as const;
}

export async function scheduleFieldDay(actor: AuthUser, form: FieldDayForm): Promise<ScheduleResult> {
	const resolved = await resolve(form);
	if (!resolved.ok) return resolved;
	const made = await db.transaction(async (tx) => {
		const rows = await tx
			.insert(fieldDays)
			.values({ ...resolved.values, createdBy: actor.id })
			.onConflictDoNothing({ target: fieldDays.slug })
			.returning({ slug: fieldDays.slug });
		if (rows.length === 0) return null;
		await recordAudit(tx, actor, { action: 'field-day.schedule', subject: form.title, detail: `${form.startsAt} ${form.timeZone}, ${form.seats} seats`, href: `/field-days/${form.slug}` });
		return rows[0].slug;
	});
	if (!made) return { ok: false, field: 'slug', message: 'Another field day already has this address.' };
	return { ok: true, slug: made };
}

/** Seats may not drop below the seats already taken; the change is told to every booked learner with a raised SEQUENCE. */
export async function changeFieldDay(actor: AuthUser, id: number, form: FieldDayForm, origin: string): Promise<ScheduleResult> {
	const resolved = await resolve(form);
	if (!resolved.ok) return resolved;
	const outcome = await db.transaction(async (tx) => {
		const [day] = await tx.select().from(fieldDays).where(eq(fieldDays.id, id)).for('update');
		if (!day) return { ok: false, message: 'There is no such field day.' } as const;
		const [{ booked }] = await tx
			.select({ booked: sql<number>`count(*)::int` })
			.from(fieldDayBookings)
			.where(and(eq(fieldDayBookings.fieldDayId, id), inArray(fieldDayBookings.status, ['booked', 'held', 'offered'])));
		if (form.seats < booked) return { ok: false, field: 'seats', message: `${booked} seats are taken or offered; keep at least that many.` } as const;
		const clash = await tx.select({ id: fieldDays.id }).from(fieldDays).where(eq(fieldDays.slug, form.slug));
		if (clash.some((c) => c.id !== id)) return { ok: false, field: 'slug', message: 'Another field day already has this address.' } as const;
		await tx.update(fieldDays).set({ ...resolved.values, updatedAt: new Date() }).where(eq(fieldDays.id, id));
		const calendarChanged = moved(day, resolved.values);
		const told = calendarChanged
			? await tx
					.update(fieldDayBookings)
					.set({ sequence: sql`${fieldDayBookings.sequence} + 1` })
					.where(and(eq(fieldDayBookings.fieldDayId, id), eq(fieldDayBookings.status, 'booked')))
					.returning({ id: fieldDayBookings.id })
			: [];
		await recordAudit(tx, actor, { action: 'field-day.change', subject: form.title, detail: calendarChanged ? `moved or changed; ${told.length} learners told` : 'details changed', href: `/field-days/${form.slug}` });
		return { ok: true, followUps: told.map((t): FollowUp => ({ kind: 'changed', bookingId: t.id })) } as const;
	});
	if (!outcome.ok) return outcome;
	await runFollowUps(outcome.followUps, origin);
	return { ok: true, slug: form.slug };
}

function moved(before: FieldDay, after: { startsAt: Date; endsAt: Date; meetingPoint: string; title: string; safetyBriefing: string; kitList: string }): boolean {
	return (
		before.startsAt.getTime() !== after.startsAt.getTime() ||
		before.endsAt.getTime() !== after.endsAt.getTime() ||
		before.meetingPoint !== after.meetingPoint ||
		before.title !== after.title ||
		before.safetyBriefing !== after.safetyBriefing ||
		before.kitList !== after.kitList
	);
}

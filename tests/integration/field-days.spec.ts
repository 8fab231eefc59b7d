// Field days end to end against PostgreSQL, the payment fake and the mail fake: the last seat under 20 concurrent
// requests, the waiting list with its time-limited offer (a pg-boss job), paid seats with refunds, and the calendar
// (RFC 5545: the same UID through every change, SEQUENCE raised with each one).
import { readFile } from 'node:fs/promises';
import { join } from 'node:path';
import { randomBytes } from 'node:crypto';
import { eq, inArray } from 'drizzle-orm';
import { simpleParser } from 'mailparser';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { db, client } from '$lib/server/db';
import { courses, fieldDayBookings, fieldDays, users, type FieldDay } from '$lib/server/db/schema';
import type { AuthUser } from '$lib/server/auth';
import { bookSeat, cancelBooking, expireSeatHold } from '$lib/server/field-days/booking';
import { changeFieldDay } from '$lib/server/field-days/schedule';
import { callOffFieldDay } from '$lib/server/field-days/call-off';
import { settleFieldDaySession } from '$lib/server/field-days/payment';
import { auditLog } from '$lib/server/db/schema';
import { getStripe } from '$lib/server/payments/stripe';
import { fieldDayForEditing } from '$lib/server/field-days/read';
import { bookingUid, feedOwner, feedToken, learnerFeed } from '$lib/server/field-days/calendar';
import { SEAT_EXPIRY_QUEUE } from '$lib/server/field-days/jobs';
import { acknowledgeOnDay, markAttendance, readRollCall } from '$lib/server/field-days/roll-call';
import { fieldDayReportCsv } from '$lib/server/field-days/report';
import { parse } from 'csv-parse/sync';
import { closeQueue } from '$lib/server/attempts/queue';
import { backgroundMailDrained } from '$lib/server/mail';
import { mailboxDir } from '$lib/server/mailbox';
import { demoSafetyBriefing } from '$lib/server/field-days/demo';
import { GET as feedGet } from '../../src/routes/api/v1/calendar/[token]/+server';
import { waitForMail } from './support/mail';
import { demoAccount, userIdOf } from './support/people';
import { origin } from './support/request-event';
import { pointAppAt, removeTestEvents, startStripeFake, startWebhookRelay, stopStripeFake, waitUntil, type Fake } from './support/payments';

let fake: Fake;
let relay: Awaited<ReturnType<typeof startWebhookRelay>>;
let restoreEnv: () => void;
let courseId: number;
const madeDays: number[] = [];
const madePeople: string[] = [];

beforeAll(async () => {
	relay = await startWebhookRelay();
	fake = await startStripeFake(relay.url);
	restoreEnv = pointAppAt(fake.port);
	courseId = (await db.query.courses.findFirst({ where: eq(courses.slug, 'daylight-flash-for-action') }))!.id;
});
afterAll(async () => {
	await backgroundMailDrained();
	await stopStripeFake(fake);
	await relay?.close();
	restoreEnv?.();
	await removeTestEvents();
	if (madeDays.length) await db.delete(fieldDays).where(inArray(fieldDays.id, madeDays));
	if (madePeople.length) await db.delete(users).where(inArray(users.id, madePeople));
	await closeQueue();
});

async function makeDay(over: Partial<typeof fieldDays.$inferInsert> = {}): Promise<FieldDay> {
	const start = new Date(Date.now() + 10 * 86_400_000);
	const [day] = await db
		.insert(fieldDays)
		.values({
			slug: `test-day-${randomBytes(4).toString('hex')}`,
			courseId,
			title: 'Test rowing dawn (test)',
			startsAt: start,
			endsAt: new Date(start.getTime() + 3 * 3_600_000),
			timeZone: 'America/New_York',
			meetingPoint: 'Boathouse slipway (test)',
			latitude: 41.5,
			longitude: -71.3,
			seats: 1,
			safetyBriefing: demoSafetyBriefing,
			...over
		})
		.returning();
	madeDays.push(day.id);
	return day;
}

/** People made straight in the table: twenty sign-ups would only test password hashing. */
async function people(n: number): Promise<AuthUser[]> {
	const rows = Array.from({ length: n }, () => {
		const id = randomBytes(15).toString('base64url');
		return { id, email: `fd-${randomBytes(5).toString('hex')}@test.example`, name: 'Field Day Tester (test)', emailVerified: true };
	});
	await db.insert(users).values(rows);
	madePeople.push(...rows.map((r) => r.id));
	return rows.map((r) => ({ id: r.id, email: r.email, name: r.name, roles: ['learner'], emailVerified: true }) as unknown as AuthUser);
}

async function bookingsOf(dayId: number) {
	return db.select().from(fieldDayBookings).where(eq(fieldDayBookings.fieldDayId, dayId));
}

/** The calendar part of the newest mail to `to` whose subject matches, read from the raw message the fake stored. */
async function calendarIn(to: string, subject: RegExp): Promise<string> {
	const message = await waitForMail(to, subject);
	const parsed = await simpleParser(await readFile(join(mailboxDir, `${message.id}.eml`)));
	const part = parsed.attachments.find((a) => a.contentType.startsWith('text/calendar') || a.contentType === 'application/ics');
	expect(part, `a calendar part in "${message.subject}"`).toBeTruthy();
	return part!.content.toString('utf8');
}

/** One property of the first VEVENT (lines unfolded as RFC 5545 §3.1 says). */
function prop(ics: string, name: string): string | null {
	const unfolded = ics.replace(/\r?\n[ \t]/g, '');
	const m = new RegExp(`^${name}(?:;[^:]*)?:(.*)$`, 'm').exec(unfolded);
	return m ? m[1].trim() : null;
}

describe('the last seat under concurrency', () => {
	test('20 learners ask for the last free seat at once: exactly one booking, 19 on the waiting list in order', async () => {
		const day = await makeDay({ seats: 2 });
		const [first] = await people(1);
		expect(await bookSeat(first, day.id, true, origin)).toMatchObject({ kind: 'booked' });
		const crowd = await people(20);
		const outcomes = await Promise.all(crowd.map((p) => bookSeat(p, day.id, true, origin)));
		expect(outcomes.filter((o) => o.kind === 'booked')).toHaveLength(1);
		const waiting = outcomes.filter((o) => o.kind === 'waiting');
		expect(waiting).toHaveLength(19);
		expect(waiting.map((w) => (w as { position: number }).position).sort((a, b) => a - b)).toEqual(Array.from({ length: 19 }, (_, i) => i + 1));
		const rows = await bookingsOf(day.id);
		expect(rows.filter((r) => r.status === 'booked')).toHaveLength(2);
		expect(rows.filter((r) => r.status === 'waiting')).toHaveLength(19);
	});

	test('a paid last seat: one checkout is opened and the seat held; the other 19 wait', async () => {
		const day = await makeDay({ seats: 1, priceCents: 3000 });
		const crowd = await people(20);
		const outcomes = await Promise.all(crowd.map((p) => bookSeat(p, day.id, true, origin)));
		const pay = outcomes.filter((o) => o.kind === 'pay');
		expect(pay).toHaveLength(1);
		expect((pay[0] as { url: string }).url).toMatch(new RegExp(`^${fake.base}/pay/cs_test_`));
		expect(outcomes.filter((o) => o.kind === 'waiting')).toHaveLength(19);
		const rows = await bookingsOf(day.id);
		expect(rows.filter((r) => r.status === 'held' && r.checkoutSessionId)).toHaveLength(1);
	});

	test('the same learner asking twice at once still holds one row', async () => {
		const day = await makeDay({ seats: 3 });
		const [p] = await people(1);
		const outcomes = await Promise.all(Array.from({ length: 5 }, () => bookSeat(p, day.id, true, origin)));
		expect(outcomes.every((o) => o.kind === 'booked')).toBe(true);
		expect(await bookingsOf(day.id)).toHaveLength(1);
	});
});

describe('booking rules', () => {
	test('without the safety briefing ticked nothing is stored', async () => {
		const day = await makeDay();
		const [p] = await people(1);
		expect(await bookSeat(p, day.id, false, origin)).toMatchObject({ kind: 'refused', status: 400 });
		expect(await bookingsOf(day.id)).toHaveLength(0);
	});

	test('a day included with enrolment is refused to someone not enrolled, and open to staff', async () => {
		const day = await makeDay({ includedWithEnrolment: true, seats: 4 });
		const [p] = await people(1);
		expect(await bookSeat(p, day.id, true, origin)).toMatchObject({ kind: 'refused', status: 403 });
		const mentor = { id: await userIdOf(demoAccount('mentor').email), email: demoAccount('mentor').email, name: 'm', roles: ['learner', 'mentor'] } as unknown as AuthUser;
		expect(await bookSeat(mentor, day.id, true, origin)).toMatchObject({ kind: 'booked' });
	});

	test('a day that has started takes no bookings', async () => {
		const day = await makeDay({ startsAt: new Date(Date.now() - 3_600_000), endsAt: new Date(Date.now() + 3_600_000) });
		const [p] = await people(1);
		expect(await bookSeat(p, day.id, true, origin)).toMatchObject({ kind: 'refused', status: 409 });
	});
});

describe('the waiting list', () => {
	test('a cancelled seat is offered to the next person by e-mail, with an expiry job; unanswered, it moves on', async () => {
		const day = await makeDay({ seats: 1 });
		const [a, b, c] = await people(3);
		expect(await bookSeat(a, day.id, true, origin)).toMatchObject({ kind: 'booked' });
		expect(await bookSeat(b, day.id, true, origin)).toMatchObject({ kind: 'waiting', position: 1 });
		expect(await bookSeat(c, day.id, true, origin)).toMatchObject({ kind: 'waiting', position: 2 });

		expect(await cancelBooking(a, day.id, origin)).toMatchObject({ ok: true, refundedCents: 0 });
		const rows = await bookingsOf(day.id);
		const offered = rows.find((r) => r.userId === b.id)!;
		expect(offered.status).toBe('offered');
		expect(offered.holdUntil!.getTime()).toBeGreaterThan(Date.now() + 23 * 3_600_000);
		expect(rows.find((r) => r.userId === c.id)!.status).toBe('waiting');
		await waitForMail(b.email, /A seat is free/);

		// the time limit is a pg-boss job stored in PostgreSQL, due when the offer runs out
		const jobs = await client`select start_after, data from pgboss.job where name = ${SEAT_EXPIRY_QUEUE} and (data->>'bookingId')::int = ${offered.id}`;
		expect(jobs).toHaveLength(1);
		expect(Math.abs(new Date(jobs[0].start_after as string).getTime() - offered.holdUntil!.getTime())).toBeLessThan(1000);

		// run early, the job changes nothing; once the offer has run out the seat goes to the next person
		expect(await expireSeatHold(offered.id, origin)).toBe('nothing');
		expect(await expireSeatHold(offered.id, origin, new Date(offered.holdUntil!.getTime() + 1000))).toBe('expired');
		const after = await bookingsOf(day.id);
		expect(after.find((r) => r.userId === b.id)!.status).toBe('cancelled');
		expect(after.find((r) => r.userId === c.id)!.status).toBe('offered');
		await waitForMail(c.email, /A seat is free/);
	});

	test('the person offered a seat takes it by booking', async () => {
		const day = await makeDay({ seats: 1 });
		const [a, b] = await people(2);
		await bookSeat(a, day.id, true, origin);
		await bookSeat(b, day.id, true, origin);
		await cancelBooking(a, day.id, origin);
		expect(await bookSeat(b, day.id, true, origin)).toMatchObject({ kind: 'booked' });
		const ics = await calendarIn(b.email, /Your seat/);
		expect(prop(ics, 'METHOD')).toBe('REQUEST');
	});
});

describe('a paid seat, its invitation, cancellation and refund', () => {
	test('pay → booked by the webhook → invitation; cancel before the deadline → refunded, CANCEL with the same UID and SEQUENCE 1', async () => {
		const day = await makeDay({ seats: 2, priceCents: 4500, refundHours: 48 });
		const [p] = await people(1);
		const started = await bookSeat(p, day.id, true, origin);
		expect(started.kind).toBe('pay');
		const paid = await fetch((started as { url: string }).url, { method: 'POST', body: new URLSearchParams({ card: '4242 4242 4242 4242', action: 'pay' }), redirect: 'manual' });
		expect(paid.status).toBe(303);
		expect(paid.headers.get('location')).toMatch(new RegExp(`/field-days/${day.slug}\\?paid=cs_test_`));
		await waitUntil(async () => (await bookingsOf(day.id))[0]?.status === 'booked', 'the webhook books the seat');
		const [row] = await bookingsOf(day.id);
		expect(row).toMatchObject({ amountCents: 4500, sequence: 0 });
		expect(row.paymentIntentId).toMatch(/^pi_/);

		const invite = await calendarIn(p.email, /Your seat/);
		// RFC 5545 §3.7.2 METHOD, §3.8.4.7 UID, §3.8.7.4 SEQUENCE; RFC 5546 §3.2.2 REQUEST
		expect(prop(invite, 'METHOD')).toBe('REQUEST');
		expect(prop(invite, 'UID')).toBe(bookingUid(row.id));
		expect(prop(invite, 'SEQUENCE')).toBe('0');
		expect(prop(invite, 'STATUS')).toBe('CONFIRMED');
		expect(prop(invite, 'DTSTART')).toBe(day.startsAt.toISOString().replace(/[-:]/g, '').replace(/\.\d{3}/, ''));
		expect(prop(invite, 'DESCRIPTION')).toContain('sandbag');

		const cancelled = await cancelBooking(p, day.id, origin);
		expect(cancelled).toMatchObject({ ok: true, refundedCents: 4500 });
		const [after] = await bookingsOf(day.id);
		expect(after).toMatchObject({ status: 'cancelled', refundedCents: 4500, sequence: 1 });
		const cancel = await calendarIn(p.email, /Cancelled:/);
		// RFC 5546 §3.2.5 CANCEL: same UID, higher SEQUENCE, STATUS:CANCELLED
		expect(prop(cancel, 'METHOD')).toBe('CANCEL');
		expect(prop(cancel, 'UID')).toBe(bookingUid(row.id));
		expect(prop(cancel, 'SEQUENCE')).toBe('1');
		expect(prop(cancel, 'STATUS')).toBe('CANCELLED');
	});

	test('cancelled after the refund deadline: the seat is freed, nothing is refunded', async () => {
		const day = await makeDay({ seats: 1, priceCents: 2000, refundHours: 24 * 30 });
		const [p] = await people(1);
		const started = await bookSeat(p, day.id, true, origin);
		await fetch((started as { url: string }).url, { method: 'POST', body: new URLSearchParams({ card: '4242 4242 4242 4242', action: 'pay' }), redirect: 'manual' });
		await waitUntil(async () => (await bookingsOf(day.id))[0]?.status === 'booked', 'the webhook books the seat');
		expect(await cancelBooking(p, day.id, origin)).toMatchObject({ ok: true, refundedCents: 0 });
		expect((await bookingsOf(day.id))[0]).toMatchObject({ status: 'cancelled', refundedCents: 0 });
	});
});

/** A seat bought through the payment fake and booked by its webhook. */
async function paidSeat(p: AuthUser, day: FieldDay): Promise<void> {
	const started = await bookSeat(p, day.id, true, origin);
	expect(started.kind).toBe('pay');
	await fetch((started as { url: string }).url, { method: 'POST', body: new URLSearchParams({ card: '4242 4242 4242 4242', action: 'pay' }), redirect: 'manual' });
	await waitUntil(async () => (await bookingsOf(day.id)).some((b) => b.userId === p.id && b.status === 'booked'), 'the webhook books the seat');
}

/** What the payment fake's charge says was refunded, whatever our rows say. */
async function refundedAtProvider(paymentIntentId: string): Promise<number> {
	const intent = await getStripe()!.paymentIntents.retrieve(paymentIntentId, { expand: ['latest_charge'] });
	return (intent.latest_charge as { amount_refunded: number }).amount_refunded;
}

describe('calling off a field day', () => {
	const reason = 'Thunderstorms are forecast all morning and the venue closes its track in lightning (test).';

	test('every place ends with the reason: the paid seat refunded in full past its deadline (once, even when called off twice), the queue told, bookings closed', async () => {
		// the refund deadline (30 days before) has passed: a learner's own cancellation would get nothing back
		const day = await makeDay({ seats: 1, priceCents: 3000, refundHours: 24 * 30 });
		const [booked, waiting, late] = await people(3);
		await paidSeat(booked, day);
		expect(await bookSeat(waiting, day.id, true, origin)).toMatchObject({ kind: 'waiting' });
		const author = { id: await userIdOf(demoAccount('author').email), email: demoAccount('author').email, roles: ['learner', 'author'] } as unknown as AuthUser;

		expect(await callOffFieldDay(author, day.id, reason, origin)).toEqual({ ok: true, told: 2, refunded: 1, refundsLeft: 0 });
		const [stored] = await db.select().from(fieldDays).where(eq(fieldDays.id, day.id));
		expect(stored).toMatchObject({ status: 'cancelled', callOffReason: reason });
		const rows = await bookingsOf(day.id);
		const seat = rows.find((r) => r.userId === booked.id)!;
		expect(seat).toMatchObject({ status: 'cancelled', refundedCents: 3000, sequence: 1 });
		expect(rows.find((r) => r.userId === waiting.id)).toMatchObject({ status: 'cancelled', refundedCents: 0 });
		expect(await refundedAtProvider(seat.paymentIntentId!)).toBe(3000);

		const cancel = await calendarIn(booked.email, /Called off:/);
		// RFC 5546 §3.2.5 CANCEL: same UID, higher SEQUENCE, STATUS:CANCELLED
		expect(prop(cancel, 'METHOD')).toBe('CANCEL');
		expect(prop(cancel, 'UID')).toBe(bookingUid(seat.id));
		expect(prop(cancel, 'SEQUENCE')).toBe('1');
		const seatMail = await waitForMail(booked.email, /Called off:/);
		expect(seatMail.text).toContain('Thunderstorms are forecast');
		expect(seatMail.text).toMatch(/\$30\.00 is on its way back to you in full/);
		const queueMail = await waitForMail(waiting.email, /Called off:/);
		expect(queueMail.text).toContain('Your place for it is cancelled.');

		expect(await bookSeat(late, day.id, true, origin)).toMatchObject({ kind: 'refused', status: 409, message: 'This field day has been called off.' });
		// again (a double click, or finishing after a failure): nothing more is refunded or written
		expect(await callOffFieldDay(author, day.id, 'A second reason (test).', origin)).toEqual({ ok: true, told: 0, refunded: 0, refundsLeft: 0 });
		expect(await refundedAtProvider(seat.paymentIntentId!)).toBe(3000);
		const lines = await db.select().from(auditLog).where(eq(auditLog.subject, day.title));
		expect(lines.filter((l) => l.action === 'field-day.call-off' && l.href === `/field-days/${day.slug}`)).toHaveLength(1);
	});

	test('a refund the payment service refuses keeps that seat until calling off again finishes it', async () => {
		const day = await makeDay({ seats: 2, priceCents: 2500 });
		const [p] = await people(1);
		await paidSeat(p, day);
		const author = { id: await userIdOf(demoAccount('author').email), email: demoAccount('author').email, roles: ['learner', 'author'] } as unknown as AuthUser;
		const port = process.env.STRIPE_API_PORT;
		process.env.STRIPE_API_PORT = '1';
		try {
			expect(await callOffFieldDay(author, day.id, reason, origin)).toEqual({ ok: true, told: 0, refunded: 0, refundsLeft: 1 });
		} finally {
			process.env.STRIPE_API_PORT = port;
		}
		expect((await bookingsOf(day.id))[0]).toMatchObject({ status: 'booked', refundedCents: 0 });
		expect(await callOffFieldDay(author, day.id, reason, origin)).toEqual({ ok: true, told: 1, refunded: 1, refundsLeft: 0 });
		expect((await bookingsOf(day.id))[0]).toMatchObject({ status: 'cancelled', refundedCents: 2500 });
	});

	test('a checkout open when the day is called off is closed, and a payment that still lands is refunded, never booked', async () => {
		const day = await makeDay({ seats: 3, priceCents: 1800 });
		const [p] = await people(1);
		expect((await bookSeat(p, day.id, true, origin)).kind).toBe('pay');
		const [held] = await bookingsOf(day.id);
		expect(held.status).toBe('held');
		const author = { id: await userIdOf(demoAccount('author').email), email: demoAccount('author').email, roles: ['learner', 'author'] } as unknown as AuthUser;
		expect(await callOffFieldDay(author, day.id, reason, origin)).toEqual({ ok: true, told: 1, refunded: 0, refundsLeft: 0 });
		expect((await bookingsOf(day.id))[0]).toMatchObject({ status: 'cancelled' });
		await waitUntil(async () => (await getStripe()!.checkout.sessions.retrieve(held.checkoutSessionId!)).status === 'expired', 'the open checkout is expired');
		// the provider's word that it was paid after all (a race with the expiry): the seat stays gone, the money goes back
		const settled = await db.transaction((tx) =>
			settleFieldDaySession(tx, { id: held.checkoutSessionId!, status: 'complete', payment_status: 'paid', payment_intent: 'pi_test_late', amount_total: 1800, metadata: { bookingId: String(held.id) } })
		);
		expect(settled).toMatchObject({ reason: 'paid after the day was called off: refunded', followUps: [{ kind: 'refund-late', bookingId: held.id, paymentIntentId: 'pi_test_late' }] });
		expect((await bookingsOf(day.id))[0].status).toBe('cancelled');
	});

	test('a day that is over cannot be called off', async () => {
		const day = await makeDay({ startsAt: new Date(Date.now() - 5 * 3_600_000), endsAt: new Date(Date.now() - 3_600_000) });
		const author = { id: await userIdOf(demoAccount('author').email), email: demoAccount('author').email, roles: ['learner', 'author'] } as unknown as AuthUser;
		expect(await callOffFieldDay(author, day.id, reason, origin)).toMatchObject({ ok: false, status: 409 });
		expect(await callOffFieldDay(author, 2_000_000_000, reason, origin)).toMatchObject({ ok: false, status: 404 });
	});
});

describe('the calendar', () => {
	test('a changed field day keeps each learner’s UID and raises SEQUENCE, in the e-mail and the private feed', async () => {
		const day = await makeDay({ seats: 3 });
		const [p] = await people(1);
		await bookSeat(p, day.id, true, origin);
		const [row] = await bookingsOf(day.id);
		const first = await calendarIn(p.email, /Your seat/);
		expect(prop(first, 'SEQUENCE')).toBe('0');

		const author = { id: await userIdOf(demoAccount('author').email), email: demoAccount('author').email, roles: ['learner', 'author'] } as unknown as AuthUser;
		const { values } = (await fieldDayForEditing(day.id))!;
		const moved = await changeFieldDay(author, day.id, { ...values, startsAt: values.startsAt.replace(/T\d{2}/, 'T05'), endsAt: values.endsAt }, origin);
		expect(moved).toEqual({ ok: true, slug: day.slug });
		const update = await calendarIn(p.email, /Changed:/);
		expect(prop(update, 'UID')).toBe(bookingUid(row.id));
		expect(prop(update, 'SEQUENCE')).toBe('1');
		expect(prop(update, 'METHOD')).toBe('REQUEST');

		const token = await feedToken(p.id);
		expect(await feedOwner(token)).toBe(p.id);
		const response = await feedGet({ params: { token }, url: new URL(`/api/v1/calendar/${token}`, origin) } as never);
		expect(response.status).toBe(200);
		expect(response.headers.get('content-type')).toMatch(/^text\/calendar/);
		const feed = await response.text();
		expect(prop(feed, 'UID')).toBe(bookingUid(row.id));
		expect(prop(feed, 'SEQUENCE')).toBe('1');

		await cancelBooking(p, day.id, origin);
		const dropped = await learnerFeed(p.id, origin);
		expect(prop(dropped, 'STATUS')).toBe('CANCELLED');
		expect(prop(dropped, 'SEQUENCE')).toBe('2');
	});

	test('an unknown feed address answers 404', async () => {
		const response = await feedGet({ params: { token: 'x'.repeat(32) }, url: new URL('/api/v1/calendar/x', origin) } as never);
		expect(response.status).toBe(404);
	});
});


describe('on the day', () => {
	test('only the mentors on duty (and admins) keep the roll call; marking who came; the briefing heard on the day', async () => {
		const mentorId = await userIdOf(demoAccount('mentor').email);
		const day = await makeDay({ seats: 3, mentorIds: [mentorId], startsAt: new Date(Date.now() + 2 * 3_600_000), endsAt: new Date(Date.now() + 5 * 3_600_000) });
		const [p] = await people(1);
		await bookSeat(p, day.id, true, origin);
		const mentor = { id: mentorId, roles: ['learner', 'mentor'] } as unknown as AuthUser;
		const otherMentor = { id: 'someone-else', roles: ['learner', 'mentor'] } as unknown as AuthUser;
		expect(await readRollCall(otherMentor, day.slug)).toMatchObject({ ok: false, status: 403 });

		const before = await readRollCall(mentor, day.slug);
		expect(before).toMatchObject({ ok: true, participants: [{ name: 'Field Day Tester (test)', came: false, onDayAt: null }] });
		const [row] = await bookingsOf(day.id);
		expect((before as { participants: { acknowledgedAt: string | null }[] }).participants[0].acknowledgedAt).not.toBeNull();

		expect(await acknowledgeOnDay(p, day.id)).toEqual({ ok: true });
		expect(await markAttendance(mentor, day.slug, row.id, true)).toEqual({ ok: true });
		expect(await markAttendance(otherMentor, day.slug, row.id, true)).toMatchObject({ ok: false, status: 403 });
		const after = await readRollCall(mentor, day.slug);
		expect(after).toMatchObject({ ok: true, participants: [{ came: true, onDayAt: expect.any(String) }] });

		// the day's report, read back with a CSV parser
		const report = parse((await fieldDayReportCsv(day.slug))!, { columns: true }) as Record<string, string>[];
		expect(report).toEqual([expect.objectContaining({ learner: 'Field Day Tester (test)', booking: 'booked', came: 'yes', attempts: '0', verdict: '', hours_to_critique: '' })]);
		expect(report[0].briefing_on_the_day).not.toBe('');
		expect(await fieldDayReportCsv('no-such-day')).toBeNull();
	});

	test('the briefing cannot be "heard on the day" days ahead, nor without a seat', async () => {
		const day = await makeDay({ seats: 3 });
		const [p, q] = await people(2);
		await bookSeat(p, day.id, true, origin);
		expect(await acknowledgeOnDay(p, day.id)).toMatchObject({ ok: false, status: 409 });
		expect(await acknowledgeOnDay(q, day.id, new Date(day.startsAt.getTime() - 3_600_000))).toMatchObject({ ok: false, status: 404 });
	});
});

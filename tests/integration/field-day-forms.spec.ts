// Scheduling a field day from the author's form (superforms + zod): refused field by field with nothing stored, then
// stored with its audit line; the learner's page shows the safety briefing and the refund rule before booking.
import { randomBytes } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { db } from '$lib/server/db';
import { auditLog, fieldDays } from '$lib/server/db/schema';
import { demoSafetyBriefing } from '$lib/server/field-days/demo';
import * as newPage from '../../src/routes/(author)/author/field-days/new/+page.server';
import * as dayPage from '../../src/routes/(learn)/field-days/[slug]/+page.server';
import { failureOf, makeEvent, throughHooks, type TestCookies } from './support/request-event';
import { demoAccount, signedInCookies } from './support/people';

const slug = `form-day-${randomBytes(4).toString('hex')}`;
let author: TestCookies;

beforeAll(async () => {
	author = await signedInCookies(demoAccount('author').email);
});
afterAll(async () => {
	await db.delete(auditLog).where(eq(auditLog.href, `/field-days/${slug}`));
	await db.delete(fieldDays).where(eq(fieldDays.slug, slug));
});

type Form = { valid: boolean; errors: Record<string, string[] | undefined> };
const formOf = (outcome: unknown): Form => {
	const value = (outcome as { value: unknown }).value;
	return ((failureOf(value)?.data ?? value) as { form: Form }).form;
};

const good = {
	__superform_id: 'field-day',
	title: 'Rowing at the boathouse (test)',
	slug,
	summary: '',
	courseSlug: 'daylight-flash-for-action',
	assignmentSlug: 'freeze-the-moment',
	startsAt: '2027-08-07T07:00',
	endsAt: '2027-08-07T10:30',
	timeZone: 'America/New_York',
	meetingPoint: 'Boathouse slipway (invented)',
	latitude: '41.5',
	longitude: '-71.31',
	seats: '6',
	price: '35.00',
	refundHours: '72',
	kitList: 'Strobe, stand, two sandbags',
	safetyBriefing: demoSafetyBriefing,
	mentorEmails: demoAccount('mentor').email
};

function post(form: Record<string, string>) {
	return throughHooks(makeEvent({ path: '/author/field-days/new', form, cookies: author }), (e) => newPage.actions.default(e as never));
}

describe('scheduling a field day', () => {
	test('a missing safety briefing, an end before the start and an unknown mentor are refused by field; nothing is stored', async () => {
		const bad = await post({ ...good, safetyBriefing: ' ', endsAt: '2027-08-07T06:00', seats: '0' });
		expect(formOf(bad).errors).toMatchObject({
			safetyBriefing: [expect.stringContaining('required')],
			endsAt: ['The end must be after the start.'],
			seats: ['At least one seat.']
		});
		const stranger = await post({ ...good, mentorEmails: 'nobody@test.example' });
		expect(formOf(stranger).errors.mentorEmails).toEqual(['Not a mentor here: nobody@test.example.']);
		expect(await db.query.fieldDays.findFirst({ where: eq(fieldDays.slug, slug) })).toBeUndefined();
	});

	test('a good form is stored in the venue’s time zone, audited, and shown to learners with the briefing and refund rule', async () => {
		expect(await post(good)).toMatchObject({ kind: 'redirect', location: '/author/field-days?notice=scheduled' });
		const day = (await db.query.fieldDays.findFirst({ where: eq(fieldDays.slug, slug) }))!;
		// IANA tz database: America/New_York is UTC−4 in August
		expect(day.startsAt.toISOString()).toBe('2027-08-07T11:00:00.000Z');
		expect(day).toMatchObject({ priceCents: 3500, seats: 6, refundHours: 72, latitude: 41.5 });
		expect(day.mentorIds).toHaveLength(1);
		expect(await db.query.auditLog.findFirst({ where: eq(auditLog.href, `/field-days/${slug}`) })).toMatchObject({ action: 'field-day.schedule' });
		const twice = await post(good);
		expect(formOf(twice).errors.slug).toEqual(['Another field day already has this address.']);

		const learner = await signedInCookies(demoAccount('learner').email);
		const page = await throughHooks(makeEvent({ path: `/field-days/${slug}`, cookies: learner, params: { slug } }), (e) => dayPage.load(e as never));
		const data = (page as unknown as { value: { day: { safetyBriefing: string; refundRule: string; price: string } } }).value.day;
		expect(data.safetyBriefing).toContain('sandbagged');
		expect(data.refundRule).toContain('at least 3 days before the start for a full refund');
		expect(data.price).toBe('$35.00');
	});
});

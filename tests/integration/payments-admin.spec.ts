// The learner's billing page and receipts; the admin payments table (filters, search) and enrolments by hand.
import { randomBytes } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { db } from '$lib/server/db';
import { courses, enrolments, payments } from '$lib/server/db/schema';
import { hasCourseAccess } from '$lib/server/enrolment-access';
import { readPaymentsQuery } from '$lib/server/payments/admin-payments';
import * as billing from '../../src/routes/(learn)/account/billing/+page.server';
import * as receipt from '../../src/routes/(learn)/account/billing/[payment]/+page.server';
import * as adminPayments from '../../src/routes/(admin)/admin/payments/+page.server';
import * as adminEnrolments from '../../src/routes/(admin)/admin/enrolments/+page.server';
import { failureOf, makeEvent, throughHooks, type Outcome, type TestCookies } from './support/request-event';
import { demoAccount, freshLearner, removeFreshPeople, signedInCookies } from './support/people';

const slug = 'daylight-flash-for-action';
let courseId: number;
let admin: TestCookies;
let payer: { id: string; email: string; cookies: TestCookies };
let paidId: number;
let pendingId: number;

beforeAll(async () => {
	courseId = (await db.query.courses.findFirst({ where: eq(courses.slug, slug) }))!.id;
	admin = await signedInCookies(demoAccount('admin').email);
	const made = await freshLearner();
	payer = { ...made, cookies: await signedInCookies(made.email) };
	const [paid, pending] = await db
		.insert(payments)
		.values([
			{
				userId: payer.id,
				courseId,
				checkoutSessionId: `cs_test_${randomBytes(8).toString('hex')}`,
				paymentIntentId: `pi_${randomBytes(8).toString('hex')}`,
				amountCents: 11920,
				currency: 'usd',
				couponCode: 'HARBOR20',
				status: 'paid',
				createdAt: new Date('2026-03-14T09:30:00Z'),
				paidAt: new Date('2026-03-14T09:31:00Z')
			},
			{ userId: payer.id, courseId, checkoutSessionId: `cs_test_${randomBytes(8).toString('hex')}`, amountCents: 14900, currency: 'usd', createdAt: new Date('2026-03-20T12:00:00Z') }
		])
		.returning({ id: payments.id });
	paidId = paid.id;
	pendingId = pending.id;
});
afterAll(removeFreshPeople);

async function load(mod: { load: (e: never) => unknown }, path: string, cookies: TestCookies, params: Record<string, string> = {}): Promise<Outcome<unknown>> {
	return throughHooks(makeEvent({ path, cookies, params }), (e) => mod.load(e as never));
}

describe('billing', () => {
	test('the learner sees their payments, newest first, with status and coupon', async () => {
		const outcome = await load(billing, '/account/billing', payer.cookies);
		const value = (outcome as { value: { payments: { id: number; status: string; couponCode: string | null }[] } }).value;
		expect(value.payments.map((p) => [p.id, p.status, p.couponCode])).toEqual([
			[pendingId, 'pending', null],
			[paidId, 'paid', 'HARBOR20']
		]);
	});

	test('a receipt opens for its owner only, and only once money moved', async () => {
		const own = await load(receipt, `/account/billing/${paidId}`, payer.cookies, { payment: String(paidId) });
		expect(own).toMatchObject({ kind: 'value', value: { receipt: { id: paidId, amountCents: 11920, couponCode: 'HARBOR20', status: 'paid' }, email: payer.email } });
		const other = await load(receipt, `/account/billing/${paidId}`, await signedInCookies(demoAccount('learner').email), { payment: String(paidId) });
		expect(other).toMatchObject({ kind: 'error', status: 404 });
		expect(await load(receipt, `/account/billing/${pendingId}`, payer.cookies, { payment: String(pendingId) })).toMatchObject({ kind: 'error', status: 404 });
		expect(await load(receipt, '/account/billing/abc', payer.cookies, { payment: 'abc' })).toMatchObject({ kind: 'error', status: 404 });
	});
});

describe('admin payments table', () => {
	type Listed = { payments: { id: number; email: string }[]; total: number };
	async function list(query: string): Promise<number[]> {
		const outcome = await load(adminPayments, `/admin/payments?${query}`, admin);
		return ((outcome as { value: Listed }).value.payments.map((p) => p.id));
	}

	test('searches by e-mail and filters by status, course and dates (whole days, UTC)', async () => {
		const byMail = `q=${encodeURIComponent(payer.email)}`;
		expect(await list(byMail)).toEqual([pendingId, paidId]);
		expect(await list(`${byMail}&status=paid`)).toEqual([paidId]);
		expect(await list(`${byMail}&status=refunded`)).toEqual([]);
		expect(await list(`${byMail}&course=${slug}`)).toEqual([pendingId, paidId]);
		expect(await list(`${byMail}&course=no-such-course`)).toEqual([]);
		expect(await list(`${byMail}&from=2026-03-14&to=2026-03-14`)).toEqual([paidId]);
		expect(await list(`${byMail}&from=2026-03-15`)).toEqual([pendingId]);
		expect(await list(`${byMail}&to=2026-03-13`)).toEqual([]);
	});

	test('a malformed query falls back to no filter; "%" is searched literally', () => {
		expect(readPaymentsQuery(new URLSearchParams('status=lost&from=2026-02-30&to=yesterday&page=-2&q=%25'))).toEqual({
			status: '',
			course: '',
			q: '%',
			from: '',
			to: '',
			page: 1
		});
	});

	test('a literal "%" matches no address', async () => {
		expect(await list('q=%25')).toEqual([]);
	});
});

describe('admin enrolments by hand', () => {
	async function act(name: 'grant' | 'setStatus', form: Record<string, string>, cookies = admin) {
		const event = makeEvent({ path: `/admin/enrolments?/${name}`, form, cookies });
		const action = adminEnrolments.actions[name] as (e: never) => unknown;
		return throughHooks(event, (e) => action(e as never));
	}

	test('grant by e-mail opens the course; revoke closes it; restore opens it again', async () => {
		const learner = await freshLearner();
		const user = { id: learner.id, roles: ['learner' as const] };
		const granted = await act('grant', { email: learner.email.toUpperCase(), course: slug });
		expect(granted).toMatchObject({ kind: 'value', value: { form: { valid: true, message: expect.stringMatching(/is enrolled in/) } } });
		const [row] = await db.select().from(enrolments).where(eq(enrolments.userId, learner.id));
		expect(row).toMatchObject({ status: 'active', source: 'admin', paymentId: null });
		expect(await hasCourseAccess(user, courseId)).toBe(true);

		// each row's form names itself, so its answer lands on that row (with or without JavaScript)
		expect(await act('setStatus', { __superform_id: `enrolment-${row.id}`, enrolmentId: String(row.id), status: 'revoked' })).toMatchObject({
			kind: 'value',
			value: { form: { id: `enrolment-${row.id}`, valid: true, message: { ok: true, text: 'Access revoked.' } } }
		});
		expect(await hasCourseAccess(user, courseId)).toBe(false);
		expect(await act('setStatus', { enrolmentId: String(row.id), status: 'active' })).toMatchObject({
			kind: 'value',
			value: { form: { message: { ok: true, text: 'Access restored.' } } }
		});
		expect(await hasCourseAccess(user, courseId)).toBe(true);

		const listed = await load(adminEnrolments, `/admin/enrolments?q=${encodeURIComponent(learner.email)}&status=active`, admin);
		const value = (listed as { value: { enrolments: { id: number; source: string }[]; statusForms: Record<number, { id: string }> } }).value;
		expect(value.enrolments).toEqual([expect.objectContaining({ id: row.id, source: 'admin' })]);
		expect(value.statusForms[row.id]).toMatchObject({ id: `enrolment-${row.id}`, data: { enrolmentId: row.id } });
	});

	test('bad input gets a message and changes nothing; non-admins are refused', async () => {
		const unknown = await act('grant', { email: 'nobody-here@test.example', course: slug });
		expect(failureOf((unknown as { value: unknown }).value)).toMatchObject({
			status: 400,
			data: { form: { errors: { email: [expect.stringMatching(/Nobody has an account/)] } } }
		});
		const notEmail = await act('grant', { email: 'not an address', course: slug, reason: 'kept' });
		// the message sits beside the field, and what was typed comes back
		expect(failureOf((notEmail as { value: unknown }).value)).toMatchObject({
			status: 400,
			data: { form: { errors: { email: ['Enter the learner’s e-mail address.'] }, data: { email: 'not an address', course: slug, reason: 'kept' } } }
		});
		const noCourse = await act('grant', { email: payer.email, course: 'no-such-course' });
		expect(failureOf((noCourse as { value: unknown }).value)).toMatchObject({ status: 400, data: { form: { errors: { course: ['That course does not exist.'] } } } });
		const badStatus = await act('setStatus', { enrolmentId: '1', status: 'deleted' });
		expect(failureOf((badStatus as { value: unknown }).value)).toMatchObject({ status: 400, data: { form: { errors: { status: ['That change is not valid.'] } } } });
		const noSuchRow = await act('setStatus', { enrolmentId: '2147483000', status: 'revoked', reason: 'kept' });
		// an enrolment that is not there: the form's message says so, and what was typed comes back
		expect(failureOf((noSuchRow as { value: unknown }).value)).toMatchObject({
			status: 400,
			data: { form: { message: { ok: false, text: 'That enrolment does not exist.' }, data: { reason: 'kept' } } }
		});
		expect(await db.select().from(enrolments).where(eq(enrolments.userId, payer.id))).toEqual([]);

		const asLearner = await act('grant', { email: payer.email, course: slug }, payer.cookies);
		expect(asLearner).toMatchObject({ kind: 'error', status: 403 });
		expect(await db.select().from(enrolments).where(eq(enrolments.userId, payer.id))).toEqual([]);
	});
});

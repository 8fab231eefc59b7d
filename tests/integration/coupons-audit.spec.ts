// Coupons from the admin screen (create, limit, last day, switch off, uses) and the audit log (filters, CSV), on the real database.
import { randomBytes } from 'node:crypto';
import { eq, inArray } from 'drizzle-orm';
import { parse } from 'csv-parse/sync';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { db } from '$lib/server/db';
import { auditLog, coupons, courses, enrolments, payments } from '$lib/server/db/schema';
import { findCoupon } from '$lib/server/payments/coupons';
import * as couponsPage from '../../src/routes/(admin)/admin/coupons/+page.server';
import * as couponPage from '../../src/routes/(admin)/admin/coupons/[code]/+page.server';
import * as auditPage from '../../src/routes/(admin)/admin/audit/+page.server';
import { GET as auditExport } from '../../src/routes/(admin)/admin/audit/export.csv/+server';
import { failureOf, makeEvent, throughHooks, type TestCookies } from './support/request-event';
import { demoAccount, freshLearner, removeFreshPeople, signedInCookies } from './support/people';

const code = `T${randomBytes(4).toString('hex').toUpperCase()}`;
let admin: TestCookies;
let courseId: number;

beforeAll(async () => {
	admin = await signedInCookies(demoAccount('admin').email);
	courseId = (await db.query.courses.findFirst({ where: eq(courses.slug, 'daylight-flash-for-action') }))!.id;
});
afterAll(async () => {
	await db.delete(auditLog).where(eq(auditLog.subject, code));
	await db.delete(coupons).where(eq(coupons.code, code));
	await removeFreshPeople();
});

type Form = { valid: boolean; errors: Record<string, string[] | undefined>; message?: string };
const formOf = (outcome: unknown): Form => {
	const value = (outcome as { value: unknown }).value;
	return ((failureOf(value)?.data ?? value) as { form: Form }).form;
};

async function post(mod: { actions: Record<string, (e: never) => unknown> }, action: string, path: string, form: Record<string, string>, cookies = admin, params: Record<string, string> = {}) {
	return throughHooks(makeEvent({ path: `${path}?/${action}`, form, cookies, params }), (e) => mod.actions[action](e as never));
}

describe('coupons', () => {
	test('an admin creates a coupon with a limit of one use; a bad one is refused by the field', async () => {
		const bad = await post(couponsPage, 'create', '/admin/coupons', { __superform_id: 'new-coupon', code: 'x', percentOff: '120', maxUses: '', lastDay: '', note: '' });
		expect(formOf(bad).errors).toMatchObject({ code: [expect.stringContaining('2–40')], percentOff: ['At most 100 % off.'] });
		const made = await post(couponsPage, 'create', '/admin/coupons', { __superform_id: 'new-coupon', code: ` ${code.toLowerCase()} `, percentOff: '25', maxUses: '1', lastDay: '', note: 'for the rowing open day' });
		expect(made).toMatchObject({ kind: 'redirect', location: `/admin/coupons/${code}?notice=created` });
		expect(await db.query.coupons.findFirst({ where: eq(coupons.code, code) })).toMatchObject({ percentOff: 25, maxUses: 1, expiresAt: null, active: true });
		const again = await post(couponsPage, 'create', '/admin/coupons', { __superform_id: 'new-coupon', code, percentOff: '10', maxUses: '0', lastDay: '', note: '' });
		expect(formOf(again).errors.code).toEqual([`A coupon ${code} exists already; open it to change it.`]);
		expect(await findCoupon(code)).toEqual({ ok: true, code, percentOff: 25 });
	});

	test('once used as often as it allows, checkout refuses it; a refund gives the use back', async () => {
		const learner = await freshLearner();
		const [paid] = await db
			.insert(payments)
			.values({ userId: learner.id, courseId, checkoutSessionId: `cs_test_${randomBytes(8).toString('hex')}`, amountCents: 11175, currency: 'usd', couponCode: code, status: 'paid', paidAt: new Date() })
			.returning({ id: payments.id });
		expect(await findCoupon(code)).toEqual({ ok: false, message: `The coupon ${code} has been used as many times as it allows.` });
		const page = await throughHooks(makeEvent({ path: `/admin/coupons/${code}`, cookies: admin, params: { code } }), (e) => couponPage.load(e as never));
		const value = (page as unknown as { value: { coupon: { uses: number; state: string }; uses: { email: string }[] } }).value;
		expect(value.coupon).toMatchObject({ uses: 1, state: 'used-up' });
		expect(value.uses.map((u) => u.email)).toEqual([learner.email]);
		await db.update(payments).set({ status: 'refunded' }).where(eq(payments.id, paid.id));
		expect(await findCoupon(code)).toMatchObject({ ok: true });
		// a course a 100 % coupon made free is a use too
		await db.insert(enrolments).values({ userId: learner.id, courseId, source: 'free', couponCode: code });
		expect(await findCoupon(code)).toMatchObject({ ok: false });
		await db.delete(enrolments).where(eq(enrolments.userId, learner.id));
	});

	test('a last day in the past ends it; switching it off ends it; each change is audited with its reason', async () => {
		const ended = await post(couponPage, 'change', `/admin/coupons/${code}`, { __superform_id: 'change-coupon', percentOff: '25', maxUses: '0', lastDay: '2020-01-31', active: 'on', reason: 'the open day is over' }, admin, { code });
		expect(formOf(ended).message).toBe('Saved. The change is in the audit log.');
		expect(await findCoupon(code)).toEqual({ ok: false, message: `The coupon ${code} has ended.` });
		// an unticked box is not sent at all: the coupon is switched off
		await post(couponPage, 'change', `/admin/coupons/${code}`, { __superform_id: 'change-coupon', percentOff: '25', maxUses: '0', lastDay: '', reason: 'paused' }, admin, { code });
		expect(await db.query.coupons.findFirst({ where: eq(coupons.code, code) })).toMatchObject({ active: false, expiresAt: null });
		const lines = await db.select().from(auditLog).where(eq(auditLog.subject, code)).orderBy(auditLog.id);
		expect(lines.map((l) => [l.action, l.reason])).toEqual([
			['coupon.create', 'for the rowing open day'],
			['coupon.change', 'the open day is over'],
			['coupon.change', 'paused']
		]);
		expect(lines[1].detail).toBe('25 % off, at most 1 uses, no end → 25 % off, no limit, last day 2020-01-31');
		expect(lines.every((l) => l.actorEmail === demoAccount('admin').email)).toBe(true);
	});

	test('only admins may open or change coupons', async () => {
		const mentor = await signedInCookies(demoAccount('mentor').email);
		expect(await post(couponsPage, 'create', '/admin/coupons', { __superform_id: 'new-coupon', code: 'NOPE', percentOff: '5' }, mentor)).toMatchObject({ kind: 'error', status: 403 });
		expect(await post(couponPage, 'change', `/admin/coupons/${code}`, { __superform_id: 'change-coupon', percentOff: '99', active: 'on' }, mentor, { code })).toMatchObject({ kind: 'error', status: 403 });
	});
});

describe('audit log', () => {
	test('filters by action and text, and exports the same rows as CSV with formulas defused', async () => {
		const page = await throughHooks(makeEvent({ path: `/admin/audit?action=coupon.change&q=${code}`, cookies: admin }), (e) => auditPage.load(e as never));
		const value = (page as unknown as { value: { entries: { action: string; subject: string }[]; total: number } }).value;
		expect(value.total).toBe(2);
		expect(value.entries.every((e) => e.action === 'coupon.change' && e.subject === code)).toBe(true);

		const [{ id }] = await db
			.insert(auditLog)
			.values({ actorEmail: 'someone@test.example', action: 'coupon.change', subject: code, detail: '=HYPERLINK("x")', reason: 'a, "quoted" reason' })
			.returning({ id: auditLog.id });
		const response = (await throughHooks(makeEvent({ path: `/admin/audit/export.csv?q=${code}`, cookies: admin }), (e) => auditExport(e as never))) as { kind: string; value: Response };
		expect(response.kind).toBe('value');
		expect(response.value.headers.get('content-type')).toBe('text/csv; charset=utf-8');
		expect(response.value.headers.get('content-disposition')).toMatch(/^attachment; filename="stopwise-audit-\d{4}-\d{2}-\d{2}\.csv"$/);
		const rows: Record<string, string>[] = parse(await response.value.text(), { columns: true });
		expect(rows).toHaveLength(4);
		expect(rows[0]).toMatchObject({ who: 'someone@test.example', action: 'coupon.change', what: `'=HYPERLINK("x")`, why: 'a, "quoted" reason' });
		expect(rows.map((r) => r.action)).toEqual(['coupon.change', 'coupon.change', 'coupon.change', 'coupon.create']);
		await db.delete(auditLog).where(inArray(auditLog.id, [id]));

		const mentor = await signedInCookies(demoAccount('mentor').email);
		expect(await throughHooks(makeEvent({ path: '/admin/audit/export.csv', cookies: mentor }), (e) => auditExport(e as never))).toMatchObject({ kind: 'error', status: 403 });
	});
});

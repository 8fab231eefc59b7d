// Admin's coupons: the list with uses, one coupon's uses, creating and changing a coupon (each change audited).
import { and, desc, eq, sql } from 'drizzle-orm';
import { db } from '../db';
import { coupons, courses, enrolments, payments, users, type Coupon } from '../db/schema';
import { recordAudit, type Actor } from '../audit';
import { couponState, endOfDay, lastDayOf, type CouponState } from './coupon-rules';
import { usesOf } from './coupons';
import type { ChangeCouponForm, NewCouponForm } from '../../forms/coupons';

export interface CouponRow {
	code: string;
	percentOff: number;
	maxUses: number | null;
	lastDay: string;
	active: boolean;
	note: string;
	uses: number;
	state: CouponState;
	createdAt: Date;
}

function toRow(c: Coupon, uses: number, now: Date): CouponRow {
	return {
		code: c.code,
		percentOff: c.percentOff,
		maxUses: c.maxUses,
		lastDay: lastDayOf(c.expiresAt),
		active: c.active,
		note: c.note,
		uses,
		state: couponState(c, uses, now),
		createdAt: c.createdAt
	};
}

export async function listCoupons(now = new Date()): Promise<CouponRow[]> {
	const rows = await db
		.select({ coupon: coupons, uses: usesOf(coupons.code) })
		.from(coupons)
		.orderBy(desc(coupons.createdAt), coupons.code);
	return rows.map((r) => toRow(r.coupon, r.uses, now));
}

export async function findCouponRow(code: string, now = new Date()): Promise<CouponRow | null> {
	const [row] = await db.select({ coupon: coupons, uses: usesOf(coupons.code) }).from(coupons).where(eq(coupons.code, code));
	return row ? toRow(row.coupon, row.uses, now) : null;
}

/** Who used a code, newest first: paid (and refunded) payments and free enrolments. */
export async function couponUses(code: string) {
	const [paid, free] = await Promise.all([
		db
			.select({ at: payments.paidAt, email: users.email, name: users.name, course: courses.title, amountCents: payments.amountCents, currency: payments.currency, status: payments.status })
			.from(payments)
			.innerJoin(users, eq(payments.userId, users.id))
			.innerJoin(courses, eq(payments.courseId, courses.id))
			.where(and(eq(payments.couponCode, code), sql`${payments.status} in ('paid', 'refunded')`)),
		db
			.select({ at: enrolments.createdAt, email: users.email, name: users.name, course: courses.title })
			.from(enrolments)
			.innerJoin(users, eq(enrolments.userId, users.id))
			.innerJoin(courses, eq(enrolments.courseId, courses.id))
			.where(and(eq(enrolments.couponCode, code), eq(enrolments.source, 'free')))
	]);
	const uses = [
		...paid.map((p) => ({ at: p.at, email: p.email, name: p.name, course: p.course, paid: { cents: p.amountCents, currency: p.currency }, refunded: p.status === 'refunded' })),
		...free.map((f) => ({ at: f.at, email: f.email, name: f.name, course: f.course, paid: null, refunded: false }))
	];
	return uses.sort((a, b) => (b.at?.getTime() ?? 0) - (a.at?.getTime() ?? 0));
}

export type CouponSave = { ok: true; code: string } | { ok: false; field?: 'code'; message: string };

function terms(input: { maxUses: number; lastDay: string }) {
	return { maxUses: input.maxUses > 0 ? input.maxUses : null, expiresAt: endOfDay(input.lastDay) };
}

function describeTerms(t: { percentOff: number; maxUses: number | null; expiresAt: Date | null; active?: boolean }): string {
	const parts = [`${t.percentOff} % off`, t.maxUses === null ? 'no limit' : `at most ${t.maxUses} uses`, t.expiresAt ? `last day ${lastDayOf(t.expiresAt)}` : 'no end'];
	if (t.active === false) parts.push('switched off');
	return parts.join(', ');
}

export async function createCoupon(actor: Actor, input: NewCouponForm): Promise<CouponSave> {
	return db.transaction(async (tx) => {
		const values = { code: input.code, percentOff: input.percentOff, note: input.note, ...terms(input) };
		const made = await tx.insert(coupons).values(values).onConflictDoNothing().returning({ code: coupons.code });
		if (!made[0]) return { ok: false, field: 'code', message: `A coupon ${input.code} exists already; open it to change it.` } as const;
		await recordAudit(tx, actor, { action: 'coupon.create', subject: input.code, detail: describeTerms(values), reason: input.note, href: `/admin/coupons/${input.code}` });
		return { ok: true, code: input.code } as const;
	});
}

export async function changeCoupon(actor: Actor, code: string, input: ChangeCouponForm): Promise<CouponSave> {
	return db.transaction(async (tx) => {
		const [before] = await tx.select().from(coupons).where(eq(coupons.code, code)).for('update');
		if (!before) return { ok: false, message: 'That coupon does not exist.' } as const;
		const next = { percentOff: input.percentOff, active: input.active, ...terms(input) };
		const was = describeTerms(before);
		const now = describeTerms(next);
		if (was === now) return { ok: true, code } as const;
		await tx.update(coupons).set(next).where(eq(coupons.code, code));
		await recordAudit(tx, actor, { action: 'coupon.change', subject: code, detail: `${was} → ${now}`, reason: input.reason, href: `/admin/coupons/${code}` });
		return { ok: true, code } as const;
	});
}

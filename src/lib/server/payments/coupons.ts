// Coupon codes: tidying what a learner typed, looking a code up, and the discounted price.
import { eq, sql } from 'drizzle-orm';
import { db } from '../db';
import { coupons, enrolments, payments } from '../db/schema';
import { couponState, refusal } from './coupon-rules';

/**
 * How many times a code was used: paid payments (a refunded one gives its use back) and courses a 100 % coupon
 * made free. A SQL expression over `code`, so the list and checkout count alike.
 */
export function usesOf(code: unknown) {
	return sql<number>`((select count(*) from ${payments} where ${payments.couponCode} = ${code} and ${payments.status} = 'paid')
		+ (select count(*) from ${enrolments} where ${enrolments.couponCode} = ${code} and ${enrolments.source} = 'free'))::int`;
}

export type CouponLookup = { ok: true; code: string; percentOff: number } | { ok: false; message: string };

/** Codes are stored upper-case; spaces a learner pasted around or inside the code are dropped. */
export function normaliseCouponCode(typed: string): string {
	return typed.replace(/\s+/g, '').toUpperCase();
}

/** Price after a percent-off coupon, rounded to the nearest cent (half a cent goes up), never below 0. */
export function discountedCents(priceCents: number, percentOff: number): number {
	const percent = Math.min(100, Math.max(0, percentOff));
	return Math.max(0, Math.round((priceCents * (100 - percent)) / 100));
}

export async function findCoupon(typed: string): Promise<CouponLookup> {
	const code = normaliseCouponCode(typed);
	if (!/^[A-Z0-9_-]{2,40}$/.test(code)) return { ok: false, message: 'That coupon code is not valid.' };
	const [found] = await db.select({ row: coupons, uses: usesOf(coupons.code) }).from(coupons).where(eq(coupons.code, code));
	if (!found) return { ok: false, message: `The coupon ${code} is not valid or has ended.` };
	const { row, uses } = found;
	const state = couponState(row, uses);
	// the limit is checked as checkout starts: two learners paying for the last use at once are both honoured
	if (state !== 'usable') return { ok: false, message: refusal(code, state) };
	if (row.percentOff < 1 || row.percentOff > 100) return { ok: false, message: `The coupon ${code} is not valid or has ended.` };
	return { ok: true, code, percentOff: row.percentOff };
}

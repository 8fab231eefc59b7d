// Coupon codes: tidying what a learner typed, looking a code up, and the discounted price.
import { eq } from 'drizzle-orm';
import { db } from '../db';
import { coupons } from '../db/schema';

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
	const row = await db.query.coupons.findFirst({ where: eq(coupons.code, code) });
	if (!row || !row.active) return { ok: false, message: `The coupon ${code} is not valid or has ended.` };
	if (row.percentOff < 1 || row.percentOff > 100) return { ok: false, message: `The coupon ${code} is not valid or has ended.` };
	return { ok: true, code, percentOff: row.percentOff };
}

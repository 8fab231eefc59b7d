// Whether a coupon can be used now: switched off, past its last day, or used up. Pure, so the rules are tested alone.

export type CouponState = 'usable' | 'off' | 'expired' | 'used-up';

export interface CouponTerms {
	active: boolean;
	maxUses: number | null;
	expiresAt: Date | null;
}

/** A coupon's state at `now`, given how many times it has been used (paid payments and free enrolments). */
export function couponState(terms: CouponTerms, uses: number, now: Date = new Date()): CouponState {
	if (!terms.active) return 'off';
	if (terms.expiresAt && now.getTime() >= terms.expiresAt.getTime()) return 'expired';
	if (terms.maxUses !== null && uses >= terms.maxUses) return 'used-up';
	return 'usable';
}

/** The moment a coupon stops working when its last day is `day` (YYYY-MM-DD): the next midnight, UTC. */
export function endOfDay(day: string): Date | null {
	if (!day) return null;
	return new Date(Date.parse(`${day}T00:00:00Z`) + 86_400_000);
}

/** The last day a coupon works, as typed in the form (the day before its end), or ''. */
export function lastDayOf(expiresAt: Date | null): string {
	return expiresAt ? new Date(expiresAt.getTime() - 86_400_000).toISOString().slice(0, 10) : '';
}

/** Words for the learner at checkout. */
export function refusal(code: string, state: Exclude<CouponState, 'usable'>): string {
	if (state === 'used-up') return `The coupon ${code} has been used as many times as it allows.`;
	if (state === 'expired') return `The coupon ${code} has ended.`;
	return `The coupon ${code} is not valid or has ended.`;
}

/** Words for the admin's table. */
export const COUPON_STATE_WORDS: Record<CouponState, string> = { usable: 'usable', off: 'switched off', expired: 'ended', 'used-up': 'used up' };

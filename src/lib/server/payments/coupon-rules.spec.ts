// The coupon rules (our own product rules, checked by hand): switched off, last day passed, uses exhausted.
import { describe, expect, test } from 'vitest';
import { couponState, endOfDay, lastDayOf, refusal } from './coupon-rules';

const open = { active: true, maxUses: null, expiresAt: null };

describe('couponState', () => {
	test('an active coupon without limits is usable however often it was used', () => {
		expect(couponState(open, 0)).toBe('usable');
		expect(couponState(open, 10_000)).toBe('usable');
	});

	test('a limit of 3 allows the 3rd use and refuses the 4th', () => {
		expect(couponState({ ...open, maxUses: 3 }, 2)).toBe('usable');
		expect(couponState({ ...open, maxUses: 3 }, 3)).toBe('used-up');
	});

	test('it works through its last day (UTC) and stops at the next midnight', () => {
		const terms = { ...open, expiresAt: endOfDay('2026-12-31') };
		expect(couponState(terms, 0, new Date('2026-12-31T23:59:59Z'))).toBe('usable');
		expect(couponState(terms, 0, new Date('2027-01-01T00:00:00Z'))).toBe('expired');
	});

	test('switched off wins over everything; an ended coupon reads as ended even when also used up', () => {
		expect(couponState({ active: false, maxUses: 1, expiresAt: new Date(0) }, 5)).toBe('off');
		expect(couponState({ active: true, maxUses: 1, expiresAt: new Date(0) }, 5, new Date(1000))).toBe('expired');
	});
});

describe('last day and end', () => {
	test('the form’s last day and the stored end are one day apart, both ways', () => {
		expect(endOfDay('2026-02-28')?.toISOString()).toBe('2026-03-01T00:00:00.000Z');
		expect(lastDayOf(new Date('2026-03-01T00:00:00Z'))).toBe('2026-02-28');
		expect(endOfDay('')).toBeNull();
		expect(lastDayOf(null)).toBe('');
	});

	test('the learner is told why a code is refused', () => {
		expect(refusal('HARBOR20', 'used-up')).toBe('The coupon HARBOR20 has been used as many times as it allows.');
		expect(refusal('HARBOR20', 'expired')).toBe('The coupon HARBOR20 has ended.');
	});
});

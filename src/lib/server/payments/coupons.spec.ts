// Coupon codes as typed, and the price after a percent-off coupon (our own pricing rule, checked by hand).
import { describe, expect, test } from 'vitest';
import { discountedCents, normaliseCouponCode } from './coupons';

describe('normaliseCouponCode', () => {
	test('drops spaces a learner pasted and upper-cases the code', () => {
		expect(normaliseCouponCode('  harbor20 ')).toBe('HARBOR20');
		expect(normaliseCouponCode('Harbor 20')).toBe('HARBOR20');
		expect(normaliseCouponCode('\tdawn-rowing_5\n')).toBe('DAWN-ROWING_5');
	});
});

describe('discountedCents', () => {
	test('takes the percentage off the price in cents', () => {
		// 20 % of 149.00 is 29.80, leaving 119.20
		expect(discountedCents(14900, 20)).toBe(11920);
		expect(discountedCents(14900, 0)).toBe(14900);
		expect(discountedCents(14900, 100)).toBe(0);
	});

	test('rounds to the nearest cent, half a cent upwards', () => {
		// 33 % off 9.99: 999 × 0.67 = 669.33 → 669
		expect(discountedCents(999, 33)).toBe(669);
		// 50 % off 0.25: 12.5 → 13
		expect(discountedCents(25, 50)).toBe(13);
	});

	test('a percentage outside 0–100 is clamped, never a negative or inflated price', () => {
		expect(discountedCents(14900, 150)).toBe(0);
		expect(discountedCents(14900, -10)).toBe(14900);
	});
});

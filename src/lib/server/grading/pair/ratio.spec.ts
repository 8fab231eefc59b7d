// The flash:ambient ratio from a lift, and the range a lift's uncertainty allows it.
import { describe, expect, it } from 'vitest';
import { ratioFromLift, ratioRange } from './index';

const pair = (lift: number, liftUncertainty: number, extra: { liftIsLowerBound?: boolean; cellThreshold?: number } = {}) => ({
	lift,
	liftUncertainty,
	liftIsLowerBound: extra.liftIsLowerBound ?? false,
	cellThreshold: extra.cellThreshold ?? 0.3
});

describe('ratioFromLift', () => {
	it('reads a flash equal to the ambient as 0 stops and an eighth of it as −3', () => {
		// light doubles when the flash matches the ambient: a 1-stop lift; 1 + 1/8 = 1.125 (hand-worked arithmetic)
		expect(ratioFromLift(1)).toBeCloseTo(0, 12);
		expect(ratioFromLift(Math.log2(1.125))).toBeCloseTo(-3, 12);
		expect(ratioFromLift(2)).toBeCloseTo(Math.log2(3), 12);
		expect(ratioFromLift(0)).toBe(-Infinity);
	});
});

describe('ratioRange', () => {
	it('carries the lift’s uncertainty through to the ratio, wider where the lift is small', () => {
		// 2^1.8 − 1 = 2.4822, 2^2.2 − 1 = 3.5948: log2 1.3116 and 1.8459 (hand-worked with a calculator)
		const wide = ratioRange(pair(2, 0.2))!;
		expect(wide.low).toBeCloseTo(1.3116, 3);
		expect(wide.high).toBeCloseTo(1.8459, 3);
		// 2^0.5 − 1 = 0.4142, 2^0.9 − 1 = 0.8661: log2 −1.2716 and −0.2074 — the same ± 0.2 spans twice the ratio
		const steep = ratioRange(pair(0.7, 0.2))!;
		expect(steep.low).toBeCloseTo(-1.2716, 3);
		expect(steep.high).toBeCloseTo(-0.2074, 3);
		expect(steep.high - steep.low).toBeGreaterThan(1.9 * (wide.high - wide.low));
	});

	it('opens the low end where the lift reaches down to the cell threshold, the high end for a lower bound', () => {
		expect(ratioRange(pair(0.35, 0.1))!.low).toBe(-Infinity);
		expect(ratioRange(pair(0.35, 0.1))!.high).toBeCloseTo(Math.log2(2 ** 0.45 - 1), 12);
		expect(ratioRange(pair(3, 0.1, { liftIsLowerBound: true }))!.high).toBe(Infinity);
		expect(ratioRange({ ...pair(1, 0.1), lift: null })).toBeNull();
		// a smaller uncertainty given for the measurement alone narrows it
		const all = ratioRange(pair(1.5, 0.5))!;
		const measuring = ratioRange(pair(1.5, 0.5), 0.1)!;
		expect(measuring.high - measuring.low).toBeLessThan(all.high - all.low);
	});
});

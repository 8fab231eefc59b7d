import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { applyGel, gels, kelvin, mired, type Gel } from './colour';
import { ExposureInputError } from './errors';

describe('mired and kelvin', () => {
	it('are reciprocal with a million', () => {
		// definition of the mired (micro reciprocal degree): M = 10^6 / T
		expect(mired(5000)).toBe(200);
		expect(mired(3200)).toBeCloseTo(312.5, 12);
		expect(kelvin(200)).toBe(5000);
	});

	it('round-trip', () => {
		fc.assert(
			fc.property(fc.double({ min: 1000, max: 40000, noNaN: true }), (k) => {
				expect(kelvin(mired(k)) / k).toBeCloseTo(1, 12);
			})
		);
	});

	it('reject zero and negatives', () => {
		expect(() => mired(0)).toThrow(ExposureInputError);
		expect(() => kelvin(-5)).toThrow(ExposureInputError);
	});
});

describe('gels', () => {
	it('carry the usual mired shifts', () => {
		// common practice, no published source: one gel maker's swatch-book figures as commonly quoted
		// (full CTO +159, half +109, quarter +64, full CTB −137, half CTB −78); other makers differ
		expect(Object.values(gels).map((g) => [g.label, g.mired])).toEqual([
			['Full CTO', 159], ['1/2 CTO', 109], ['1/4 CTO', 64], ['Full CTB', -137], ['1/2 CTB', -78]
		]);
	});

	it('turn 5600 K daylight into about 2950 K with a full CTO', () => {
		// common practice: 10^6/5600 ≈ 179 mired, + 159 = 338 mired ≈ 2960 K (mired arithmetic)
		expect(applyGel(5600, 'full-cto')).toBeCloseTo(1e6 / (1e6 / 5600 + 159), 9);
		expect(applyGel(5600, gels['full-cto'])).toBeGreaterThan(2900);
		expect(applyGel(5600, gels['full-cto'])).toBeLessThan(3000);
	});

	it('turn 3200 K tungsten into about 5700 K with a full CTB', () => {
		// common practice, no published source: full CTB is sold as 3200 K → ~5700 K
		expect(Math.abs(applyGel(3200, 'full-ctb') - 5700)).toBeLessThan(100);
	});

	it('warm with CTO and cool with CTB, adding in mireds when stacked', () => {
		fc.assert(
			fc.property(fc.double({ min: 2500, max: 9000, noNaN: true }), (k) => {
				expect(applyGel(k, 'quarter-cto')).toBeLessThan(k);
				expect(applyGel(k, 'half-ctb')).toBeGreaterThan(k);
				const stacked = applyGel(applyGel(k, 'half-cto'), 'quarter-cto');
				expect(mired(stacked) - mired(k)).toBeCloseTo(109 + 64, 9);
			})
		);
	});

	it('reject unknown gels and impossible results', () => {
		expect(() => applyGel(5600, 'green' as never)).toThrow(ExposureInputError);
		expect(() => applyGel(5600, { id: 'full-cto', label: 'x', mired: Number.NaN } as Gel)).toThrow(ExposureInputError);
		// 20000 K is 50 mired; a full CTB would need a negative mired
		expect(() => applyGel(20000, 'full-ctb')).toThrow(/cannot cool/);
	});
});

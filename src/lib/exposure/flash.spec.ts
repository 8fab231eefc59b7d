import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { ExposureInputError } from './errors';
import { falloffStops, flashAperture, flashDistance, flashStops, guideNumber, hssCost, mix, powerSteps } from './flash';

const positive = (min: number, max: number) => fc.double({ min, max, noNaN: true });

describe('guide number', () => {
	it('is distance times f-number', () => {
		// definition of guide number, ISO 1230:1992: GN = distance × f-number (metres, ISO 100)
		expect(flashAperture(40, 5)).toBe(8);
		expect(flashDistance(40, 8)).toBe(5);
		expect(flashStops({ gn: 40, distance: 5, aperture: 8 })).toBeCloseTo(0, 12);
	});

	it('scales with the square root of ISO and of power', () => {
		// follows from the GN definition (ISO 1230) and exposure ∝ S·power/N²: ×4 speed or ×4 power doubles GN
		expect(guideNumber(40, { iso: 400 })).toBeCloseTo(80, 12);
		expect(guideNumber(40, { power: 1 / 4 })).toBeCloseTo(20, 12);
		expect(guideNumber(40, { iso: 400, power: 1 / 4 })).toBeCloseTo(40, 12);
		expect(guideNumber(40, { iso: 200 })).toBeCloseTo(40 * Math.SQRT2, 12);
		expect(guideNumber(40)).toBe(40);
	});

	it('rejects a power above full or a non-positive guide number', () => {
		expect(() => guideNumber(40, { power: 2 })).toThrow(ExposureInputError);
		expect(() => guideNumber(0)).toThrow(ExposureInputError);
		expect(() => flashAperture(40, 0)).toThrow(/distance must be greater than 0/);
	});
});

describe('flashStops', () => {
	it('loses two stops per doubling of distance', () => {
		// inverse-square law: illuminance ∝ 1/d², so 2× distance is ¼ the light = −2 stops
		fc.assert(
			fc.property(positive(5, 120), positive(0.3, 30), positive(1, 32), (gn, d, n) => {
				expect(flashStops({ gn, distance: d, aperture: n }) - flashStops({ gn, distance: 2 * d, aperture: n })).toBeCloseTo(2, 9);
			})
		);
	});

	it('moves one stop per power step, per aperture stop and per ISO stop', () => {
		// ISO 1230 GN definition with exposure ∝ power·S/N²
		const base = { gn: 60, distance: 4, aperture: 8, iso: 100, power: 1 };
		expect(flashStops({ ...base, power: 1 / 2 }) - flashStops(base)).toBeCloseTo(-1, 12);
		expect(flashStops({ ...base, aperture: 8 / Math.SQRT2 }) - flashStops(base)).toBeCloseTo(1, 12);
		expect(flashStops({ ...base, iso: 200 }) - flashStops(base)).toBeCloseTo(1, 12);
		// GN 60 at 4 m wants f/15; at f/8 that is 2·log2(15/8) ≈ +1.81 stops over
		expect(flashStops(base)).toBeCloseTo(2 * Math.log2(15 / 8), 12);
	});

	it('agrees with the power step table', () => {
		const base = { gn: 60, distance: 7.5, aperture: 8 };
		for (const step of powerSteps) {
			expect(flashStops({ ...base, power: step.power })).toBeCloseTo(-step.stopsBelowFull, 12);
		}
	});
});

describe('powerSteps', () => {
	it('runs from 1/1 to 1/256 in one-stop steps', () => {
		// manual flash power ladder, each halving is one stop (common practice)
		expect(powerSteps.map((p) => p.label)).toEqual(['1/1', '1/2', '1/4', '1/8', '1/16', '1/32', '1/64', '1/128', '1/256']);
		powerSteps.forEach((p, i) => {
			expect(p.stopsBelowFull).toBe(i);
			expect(p.power).toBe(1 / 2 ** i);
		});
	});
});

describe('falloffStops', () => {
	it('follows the inverse-square law', () => {
		// inverse-square law
		expect(falloffStops(2, 4)).toBeCloseTo(2, 12);
		expect(falloffStops(1, 10)).toBeCloseTo(2 * Math.log2(10), 12);
		expect(falloffStops(3, 3)).toBe(0);
	});
});

describe('hssCost', () => {
	it('costs nothing at or below sync speed', () => {
		// common practice, no published source: HSS only engages above sync
		expect(hssCost({ shutter: 1 / 250, syncSpeed: 1 / 250 })).toBe(0);
		expect(hssCost({ shutter: 1 / 60, syncSpeed: 1 / 250 })).toBe(0);
		// the '1/250' mark is 2^-8 = 1/256 s: still at sync
		expect(hssCost({ shutter: 1 / 256, syncSpeed: 1 / 250 })).toBe(0);
	});

	it('costs the entry loss plus a stop per doubling of shutter speed above sync', () => {
		// common practice, no published source: about 1 stop to enter HSS, then 1 stop per doubling
		expect(hssCost({ shutter: 1 / 500, syncSpeed: 1 / 250 })).toBeCloseTo(2, 12);
		expect(hssCost({ shutter: 1 / 1000, syncSpeed: 1 / 250 })).toBeCloseTo(3, 12);
		expect(hssCost({ shutter: 1 / 8000, syncSpeed: 1 / 250 })).toBeCloseTo(6, 12);
		expect(hssCost({ shutter: 1 / 320, syncSpeed: 1 / 250 })).toBeCloseTo(1 + Math.log2(320 / 250), 12);
		expect(hssCost({ shutter: 1 / 400, syncSpeed: 1 / 200, entryLoss: 0.5 })).toBeCloseTo(1.5, 12);
	});

	it('grows by exactly one stop per halving of time above sync', () => {
		fc.assert(
			fc.property(positive(1 / 16000, 1 / 500), (t) => {
				const sync = 1 / 250;
				expect(hssCost({ shutter: t / 2, syncSpeed: sync }) - hssCost({ shutter: t, syncSpeed: sync })).toBeCloseTo(1, 9);
			})
		);
	});

	it('rejects missing times', () => {
		expect(() => hssCost({ shutter: 0, syncSpeed: 1 / 250 })).toThrow(ExposureInputError);
		expect(() => hssCost({ shutter: 1 / 500, syncSpeed: 1 / 250, entryLoss: -1 })).toThrow(ExposureInputError);
	});
});

describe('mix', () => {
	it('adds light linearly', () => {
		// linear addition of illuminance: two equal sources give twice the light = +1 stop
		expect(mix({ ambientStops: 0, flashStops: 0 })).toBeCloseTo(1, 12);
		expect(mix({ ambientStops: -1, flashStops: 0 })).toBeCloseTo(Math.log2(1.5), 12);
		expect(mix({ ambientStops: -2, flashStops: 1 })).toBeCloseTo(Math.log2(0.25 + 2), 12);
	});

	it('treats −Infinity as no light', () => {
		expect(mix({ ambientStops: -Infinity, flashStops: 0.5 })).toBe(0.5);
		expect(mix({ ambientStops: -1.5, flashStops: -Infinity })).toBe(-1.5);
		expect(mix({ ambientStops: -Infinity, flashStops: -Infinity })).toBe(-Infinity);
	});

	it('does not overflow for large stop values', () => {
		expect(mix({ ambientStops: 2000, flashStops: 2000 })).toBeCloseTo(2001, 9);
		expect(mix({ ambientStops: -2000, flashStops: -2000 })).toBeCloseTo(-1999, 9);
	});

	it('is symmetric, monotonic and between max and max + 1', () => {
		// algebra of log2(2^a + 2^f)
		const stops = fc.double({ min: -30, max: 30, noNaN: true });
		fc.assert(
			fc.property(stops, stops, fc.double({ min: 0, max: 5, noNaN: true }), (a, f, more) => {
				const m = mix({ ambientStops: a, flashStops: f });
				expect(m).toBeCloseTo(mix({ ambientStops: f, flashStops: a }), 9);
				expect(mix({ ambientStops: a + more, flashStops: f })).toBeGreaterThanOrEqual(m - 1e-12);
				expect(mix({ ambientStops: a, flashStops: f + more })).toBeGreaterThanOrEqual(m - 1e-12);
				expect(m).toBeGreaterThanOrEqual(Math.max(a, f) - 1e-12);
				expect(m).toBeLessThanOrEqual(Math.max(a, f) + 1 + 1e-12);
			})
		);
	});

	it('rejects NaN', () => {
		expect(() => mix({ ambientStops: Number.NaN, flashStops: 0 })).toThrow(ExposureInputError);
	});
});

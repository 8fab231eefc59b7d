import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { ev100 } from './apex';
import { equivalentExposures } from './equivalents';
import { ExposureInputError } from './errors';

describe('equivalentExposures', () => {
	it('lists the sunny-16 reciprocity line for EV 15 at ISO 100', () => {
		// published EV tables: EV 15 = f/16 1/125 = f/11 1/250 = f/8 1/500 = f/5.6 1/1000 = f/4 1/2000
		const rows = equivalentExposures(15, { iso: 100 });
		const byAperture = Object.fromEntries(rows.map((r) => [r.apertureLabel, r.shutterLabel]));
		expect(byAperture).toMatchObject({
			'f/16': '1/125', 'f/11': '1/250', 'f/8': '1/500', 'f/5.6': '1/1000', 'f/4': '1/2000', 'f/22': '1/60'
		});
		for (const r of rows) expect(r.offStops).toBeCloseTo(0, 9);
	});

	it('shifts shutter times by the ISO difference', () => {
		// APEX: two stops more speed (ISO 400) needs two stops less time
		const rows = equivalentExposures(15, { iso: 400 });
		expect(rows.find((r) => r.apertureLabel === 'f/16')?.shutterLabel).toBe('1/500');
	});

	it('keeps only shutter times inside the range', () => {
		const rows = equivalentExposures(15, { iso: 100, shutterRange: { min: 1 / 4000, max: 1 / 30 } });
		expect(rows.map((r) => r.apertureLabel)).toEqual(['f/2.8', 'f/4', 'f/5.6', 'f/8', 'f/11', 'f/16', 'f/22', 'f/32']);
		// the default range stops at 1/8000 (f/2 gives 1/8000 at EV 15, f/1.4 would need 1/16000)
		expect(equivalentExposures(15, { iso: 100 })[0].apertureLabel).toBe('f/2');
	});

	it('counts a mark as inside the range by its printed name', () => {
		// the '30"' mark is 2^5 = 32 s and '15"' is 16 s (APEX Tv −5, −4); a 30 s or 15 s limit must still include them
		const night = equivalentExposures(0, { iso: 100 });
		expect(night.find((r) => r.apertureLabel === 'f/5.6')?.shutterLabel).toBe('30"');
		const capped = equivalentExposures(0, { iso: 100, shutterRange: { max: 15 } });
		expect(capped.find((r) => r.apertureLabel === 'f/4')?.shutterLabel).toBe('15"');
		expect(capped.some((r) => r.apertureLabel === 'f/5.6')).toBe(false);
	});

	it('uses the apertures it is given', () => {
		const rows = equivalentExposures(12, { iso: 100, apertures: [2.8, 4] });
		expect(rows.map((r) => `${r.apertureLabel} ${r.shutterLabel}`)).toEqual(['f/2.8 1/500', 'f/4 1/250']);
	});

	it('reports the EV each row really gives, within half a step of the wanted EV', () => {
		// consistency with ev100; a third-stop series is never more than 1/6 stop off
		fc.assert(
			fc.property(fc.double({ min: 3, max: 18, noNaN: true }), fc.constantFrom(100, 200, 400, 1600), (ev, iso) => {
				for (const r of equivalentExposures(ev, { iso })) {
					expect(r.ev100).toBeCloseTo(ev100({ aperture: r.aperture, shutter: r.shutter, iso }), 9);
					expect(r.offStops).toBeCloseTo(r.ev100 - ev, 9);
					expect(Math.abs(r.offStops)).toBeLessThanOrEqual(1 / 6 + 1e-9);
				}
			})
		);
	});

	it('rejects bad options', () => {
		expect(() => equivalentExposures(15, {} as never)).toThrow(ExposureInputError);
		expect(() => equivalentExposures(Number.NaN, { iso: 100 })).toThrow(ExposureInputError);
		expect(() => equivalentExposures(15, { iso: 100, shutterRange: { min: 1, max: 1 / 100 } })).toThrow(/longer than/);
	});
});

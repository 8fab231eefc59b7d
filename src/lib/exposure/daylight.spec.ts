import { describe, expect, it } from 'vitest';
import { ev100 } from './apex';
import { daylightConditions, daylightEv, type DaylightCondition } from './daylight';
import { ExposureInputError } from './errors';
import { parseAperture } from './format';

describe('daylightEv', () => {
	it('gives the daylight rows of the published exposure table', () => {
		// common practice, no published source we could read ourselves: these are the daylight rows of
		// ANSI PH2.7-1973/1986 as reproduced in secondary sources (sand/snow 16, sun 15, hazy 14,
		// cloudy bright 13, heavy overcast 12, open shade 12), not checked against the standard's text
		expect(daylightEv('sun-on-sand-or-snow')).toBe(16);
		expect(daylightEv('bright-sun')).toBe(15);
		expect(daylightEv('hazy-sun')).toBe(14);
		expect(daylightEv('overcast')).toBe(13);
		expect(daylightEv('heavy-overcast')).toBe(12);
		expect(daylightEv('open-shade')).toBe(12);
	});

	it('agrees with the sunny-16 rule within half a stop', () => {
		// common practice, no published source: sunny 16 = f/16 at 1/ISO s in bright sun (EV100 14.6)
		expect(Math.abs(ev100({ aperture: 16, shutter: 1 / 100, iso: 100 }) - daylightEv('bright-sun'))).toBeLessThan(0.5);
		for (const c of daylightConditions) {
			const n = parseAperture(c.sunnyRule.split(' ')[0]);
			expect(Math.abs(ev100({ aperture: n, shutter: 1 / 100, iso: 100 }) - c.ev100)).toBeLessThan(0.5);
		}
	});

	it('lists conditions brightest first, with labels and unique ids', () => {
		expect(daylightConditions.length).toBe(6);
		expect(new Set(daylightConditions.map((c) => c.id)).size).toBe(daylightConditions.length);
		daylightConditions.forEach((c, i) => {
			expect(c.label.length).toBeGreaterThan(3);
			expect(daylightEv(c.id)).toBe(c.ev100);
			if (i > 0) expect(c.ev100).toBeLessThanOrEqual(daylightConditions[i - 1].ev100);
		});
	});

	it('rejects an unknown condition by naming the known ones', () => {
		expect(() => daylightEv('moonlight' as DaylightCondition)).toThrow(ExposureInputError);
		expect(() => daylightEv('moonlight' as DaylightCondition)).toThrow(/bright-sun/);
	});
});

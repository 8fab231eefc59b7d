import { converter } from 'culori';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
	apparentCct,
	cctFromXy,
	ILLUMINANT_A,
	ILLUMINANT_D65,
	xyFromCct,
	xyFromXyz,
	xyzFromXy
} from './chromaticity';
import { ExposureInputError } from './errors';

const toLrgb = converter('lrgb');

describe('cctFromXy (McCamy 1992)', () => {
	it('gives McCamy\'s worked values for D65 and illuminant A', () => {
		// McCamy, Color Res. Appl. 17(2), 1992: D65 → ≈ 6504 K, A → ≈ 2856 K (within a few K);
		// chromaticities from CIE 015:2004 (D65 0.31271, 0.32902; A 0.44757, 0.40745)
		expect(Math.abs(cctFromXy(ILLUMINANT_D65.x, ILLUMINANT_D65.y) - 6504)).toBeLessThan(3);
		expect(Math.abs(cctFromXy(ILLUMINANT_A.x, ILLUMINANT_A.y) - 2856)).toBeLessThan(3);
		expect(Math.abs(cctFromXy(0.31271, 0.32902) - 6504)).toBeLessThan(3);
	});

	it('rejects points that are not chromaticities', () => {
		expect(() => cctFromXy(-0.1, 0.3)).toThrow(ExposureInputError);
		expect(() => cctFromXy(0.7, 0.5)).toThrow(ExposureInputError);
		expect(() => cctFromXy(0.3, 0.1858)).toThrow(/epicentre/);
	});
});

describe('xyFromCct (Kang et al. 2002)', () => {
	it('lands on illuminant A at 2856 K', () => {
		// Kang et al., J. Korean Phys. Soc. 41(6) 2002 locus vs CIE 015:2004 illuminant A (a 2856 K Planckian radiator)
		const a = xyFromCct(2856);
		expect(Math.abs(a.x - ILLUMINANT_A.x)).toBeLessThan(1e-3);
		expect(Math.abs(a.y - ILLUMINANT_A.y)).toBeLessThan(1e-3);
	});

	it('lies just below D65 at 6504 K (daylight is greener than a black body)', () => {
		// CIE 015:2004: D65 sits above the Planckian locus; same x within 0.002, y lower by a few thousandths
		const p = xyFromCct(6504);
		expect(Math.abs(p.x - ILLUMINANT_D65.x)).toBeLessThan(2e-3);
		expect(ILLUMINANT_D65.y - p.y).toBeGreaterThan(0.002);
		expect(ILLUMINANT_D65.y - p.y).toBeLessThan(0.008);
	});

	it('joins its pieces continuously at 2222 K and 4000 K', () => {
		// Kang et al. 2002 piecewise cubic: the segments meet at the break points
		for (const t of [2222, 4000]) {
			const below = xyFromCct(t - 1e-6);
			const above = xyFromCct(t + 1e-6);
			expect(Math.abs(below.x - above.x)).toBeLessThan(1e-4);
			expect(Math.abs(below.y - above.y)).toBeLessThan(1e-4);
		}
	});

	it('moves towards blue as temperature rises and McCamy reads it back within 1.5 %', () => {
		// two independent published fits (Kang 2002 locus, McCamy 1992 CCT) agree on the locus
		fc.assert(
			fc.property(fc.double({ min: 2000, max: 9000, noNaN: true }), fc.double({ min: 1, max: 500, noNaN: true }), (t, dt) => {
				const p = xyFromCct(t);
				expect(xyFromCct(t + dt).x).toBeLessThan(p.x);
				expect(Math.abs(cctFromXy(p.x, p.y) / t - 1)).toBeLessThan(0.015);
			})
		);
	});

	it('refuses temperatures outside 1667–25000 K', () => {
		expect(() => xyFromCct(1500)).toThrow(/between 1667 K and 25000 K/);
		expect(() => xyFromCct(30000)).toThrow(ExposureInputError);
		expect(() => xyFromCct(Number.NaN)).toThrow(ExposureInputError);
	});
});

describe('xyz ↔ xy helpers', () => {
	it('round-trip', () => {
		const xyz = xyzFromXy(ILLUMINANT_A, 0.5);
		expect(xyz[1]).toBe(0.5);
		const back = xyFromXyz(xyz);
		expect(back?.x).toBeCloseTo(ILLUMINANT_A.x, 12);
		expect(back?.y).toBeCloseTo(ILLUMINANT_A.y, 12);
		expect(xyFromXyz([0, 0, 0])).toBeNull();
	});
});

describe('apparentCct', () => {
	it('reads sRGB white as D65, about 6504 K', () => {
		// IEC 61966-2-1 white is D65; McCamy 1992 gives ≈ 6504 K for it
		expect(Math.abs((apparentCct([1, 1, 1]) ?? 0) - 6504)).toBeLessThan(5);
		expect(Math.abs((apparentCct([0.18, 0.18, 0.18]) ?? 0) - 6504)).toBeLessThan(5);
	});

	it('reads illuminant A, expressed in linear sRGB by culori, as about 2856 K', () => {
		// culori 4 xyz65 → lrgb as an independent conversion; CIE 015:2004 A chromaticity; McCamy 1992
		const [X, Y, Z] = xyzFromXy(ILLUMINANT_A, 0.4);
		const c = toLrgb({ mode: 'xyz65', x: X, y: Y, z: Z });
		expect(Math.min(c.r, c.g, c.b)).toBeGreaterThan(0);
		expect(Math.abs((apparentCct([c.r, c.g, c.b]) ?? 0) - 2856)).toBeLessThan(6);
	});

	it('ignores brightness and returns null for black', () => {
		fc.assert(
			fc.property(fc.double({ min: 0.01, max: 100, noNaN: true }), (k) => {
				expect(apparentCct([0.3 * k, 0.25 * k, 0.2 * k])).toBeCloseTo(apparentCct([0.3, 0.25, 0.2]) ?? 0, 6);
			})
		);
		expect(apparentCct([0, 0, 0])).toBeNull();
	});

	it('reads warmer for redder colours', () => {
		expect(apparentCct([0.5, 0.4, 0.3]) ?? 0).toBeLessThan(apparentCct([0.3, 0.4, 0.5]) ?? 0);
	});

	it('rejects negative or missing channels', () => {
		expect(() => apparentCct([-0.1, 0.2, 0.2])).toThrow(ExposureInputError);
		expect(() => apparentCct([0.1, 0.2] as never)).toThrow(ExposureInputError);
	});
});

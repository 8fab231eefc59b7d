import { converter, convertLrgbToRgb, convertRgbToLrgb, wcagLuminance } from 'culori';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { ExposureInputError } from './errors';
import {
	linearSrgbToXyz,
	relativeLuminance,
	SRGB_TO_XYZ,
	SRGB_WHITE_XYZ,
	srgbDecode,
	srgbEncode,
	XYZ_TO_SRGB,
	xyzToLinearSrgb
} from './srgb';

const toXyz65 = converter('xyz65');
const toLrgb = converter('lrgb');
const unit = fc.double({ min: 0, max: 1, noNaN: true });
const xyOf = ([X, Y, Z]: readonly number[]) => [X / (X + Y + Z), Y / (X + Y + Z)];

describe('sRGB transfer function', () => {
	it('uses the IEC 61966-2-1 constants', () => {
		// IEC 61966-2-1:1999: linear segment slope 12.92 below 0.0031308 (encoded 0.04045), then 1.055·L^(1/2.4) − 0.055
		expect(srgbEncode(0.001)).toBeCloseTo(0.01292, 12);
		expect(srgbDecode(0.02)).toBeCloseTo(0.02 / 12.92, 12);
		expect(srgbDecode(0.04045)).toBeCloseTo(0.04045 / 12.92, 12);
		expect(srgbEncode(0.0031308)).toBeCloseTo(0.04045, 5);
		expect(srgbDecode(0.5)).toBeCloseTo(((0.5 + 0.055) / 1.055) ** 2.4, 12);
		expect(srgbEncode(0.5)).toBeCloseTo(1.055 * 0.5 ** (1 / 2.4) - 0.055, 12);
		expect(srgbEncode(1)).toBeCloseTo(1, 12);
		expect(srgbEncode(0)).toBe(0);
	});

	it('encodes 18 % grey as 118 of 255', () => {
		// IEC 61966-2-1 transfer function; 18 % reflectance mid-grey (ISO 12232 / ISO 2720 practice) → 117.6
		expect(Math.round(srgbEncode(0.18) * 255)).toBe(118);
	});

	it('round-trips and agrees with culori', () => {
		// culori 4 (lrgb ↔ rgb, CSS Color 4 sRGB curve) as an independent reference
		fc.assert(
			fc.property(unit, (v) => {
				expect(srgbDecode(srgbEncode(v))).toBeCloseTo(v, 12);
				expect(srgbDecode(v)).toBeCloseTo(convertRgbToLrgb({ r: v, g: v, b: v }).r, 12);
				expect(srgbEncode(v)).toBeCloseTo(convertLrgbToRgb({ r: v, g: v, b: v }).r, 12);
			})
		);
	});

	it('rejects NaN', () => {
		expect(() => srgbEncode(Number.NaN)).toThrow(ExposureInputError);
	});
});

describe('linear sRGB ↔ XYZ', () => {
	it('puts the sRGB primaries and white where IEC 61966-2-1 says', () => {
		// IEC 61966-2-1: R (0.64, 0.33), G (0.30, 0.60), B (0.15, 0.06), white D65 (0.3127, 0.3290)
		const near = (a: number[], b: number[]) => a.forEach((v, i) => expect(v).toBeCloseTo(b[i], 3));
		near(xyOf(linearSrgbToXyz([1, 0, 0])), [0.64, 0.33]);
		near(xyOf(linearSrgbToXyz([0, 1, 0])), [0.3, 0.6]);
		near(xyOf(linearSrgbToXyz([0, 0, 1])), [0.15, 0.06]);
		// CIE 015:2004 D65 (0.31271, 0.32902)
		near(xyOf(SRGB_WHITE_XYZ), [0.31271, 0.32902]);
		expect(SRGB_WHITE_XYZ[1]).toBeCloseTo(1, 12);
	});

	it('inverts to the inverse matrix printed in the standard', () => {
		// IEC 61966-2-1:1999 XYZ → RGB matrix, four decimals (from memory)
		const printed = [
			[3.2406, -1.5372, -0.4986],
			[-0.9689, 1.8758, 0.0415],
			[0.0557, -0.204, 1.057]
		];
		printed.forEach((row, i) => row.forEach((v, j) => expect(Math.abs(XYZ_TO_SRGB[i][j] - v)).toBeLessThan(1e-3)));
		expect(SRGB_TO_XYZ[1]).toEqual([0.2126, 0.7152, 0.0722]);
	});

	it('agrees with culori within the four-decimal rounding of the standard', () => {
		// culori 4 xyz65 (matrix derived from the same primaries) as an independent reference
		fc.assert(
			fc.property(unit, unit, unit, (r, g, b) => {
				const ours = linearSrgbToXyz([r, g, b]);
				const theirs = toXyz65({ mode: 'lrgb', r, g, b });
				expect(Math.abs(ours[0] - theirs.x)).toBeLessThan(2e-4);
				expect(Math.abs(ours[1] - theirs.y)).toBeLessThan(2e-4);
				expect(Math.abs(ours[2] - theirs.z)).toBeLessThan(2e-4);
				const back = xyzToLinearSrgb([theirs.x, theirs.y, theirs.z]);
				const lrgb = toLrgb(theirs);
				expect(Math.abs(back[0] - lrgb.r)).toBeLessThan(1e-3);
				expect(Math.abs(back[1] - lrgb.g)).toBeLessThan(1e-3);
				expect(Math.abs(back[2] - lrgb.b)).toBeLessThan(1e-3);
			})
		);
	});

	it('round-trips', () => {
		fc.assert(
			fc.property(unit, unit, unit, (r, g, b) => {
				const back = xyzToLinearSrgb(linearSrgbToXyz([r, g, b]));
				[r, g, b].forEach((v, i) => expect(back[i]).toBeCloseTo(v, 10));
			})
		);
	});
});

describe('relativeLuminance', () => {
	it('uses the BT.709 weights', () => {
		// ITU-R BT.709-6: Y = 0.2126 R + 0.7152 G + 0.0722 B (linear)
		expect(relativeLuminance([1, 0, 0])).toBe(0.2126);
		expect(relativeLuminance([0, 1, 0])).toBe(0.7152);
		expect(relativeLuminance([0, 0, 1])).toBe(0.0722);
		expect(relativeLuminance([0.18, 0.18, 0.18])).toBeCloseTo(0.18, 12);
	});

	it('agrees with culori and with the Y row of the XYZ matrix', () => {
		// culori 4 wcagLuminance (same BT.709 weights on linear sRGB) as an independent reference
		fc.assert(
			fc.property(unit, unit, unit, (r, g, b) => {
				const y = relativeLuminance([r, g, b]);
				expect(y).toBeCloseTo(wcagLuminance({ mode: 'lrgb', r, g, b }), 9);
				expect(y).toBeCloseTo(linearSrgbToXyz([r, g, b])[1], 12);
			})
		);
	});

	it('rejects a wrong-shaped colour', () => {
		expect(() => relativeLuminance([1, 2] as never)).toThrow(ExposureInputError);
		expect(() => relativeLuminance([1, Number.NaN, 0])).toThrow(ExposureInputError);
	});
});

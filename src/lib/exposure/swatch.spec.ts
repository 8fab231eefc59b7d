import { convertXyz65ToXyz50, converter, formatHex } from 'culori';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { applyGel } from './colour';
import { xyFromCct, xyzFromXy } from './chromaticity';
import { ExposureInputError } from './errors';
import { SRGB_WHITE_XYZ, type Xyz } from './srgb';
import { adaptXyz, bradfordMatrix, renderedSwatch } from './swatch';

const toRgb = converter('rgb');
const channels = (hex: string) => [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16));
// culori's own white points (CSS Color 4 values, 0.3127/0.3290 and 0.3457/0.3585)
const CULORI_D65: Xyz = [0.3127 / 0.329, 1, (1 - 0.3127 - 0.329) / 0.329];
const CULORI_D50: Xyz = [0.3457 / 0.3585, 1, (1 - 0.3457 - 0.3585) / 0.3585];

describe('Bradford adaptation', () => {
	it('matches culori\'s D65 → D50 Bradford transform', () => {
		// culori 4 convertXyz65ToXyz50 (Bradford, CSS Color 4) as an independent reference
		const unit = fc.double({ min: 0, max: 1, noNaN: true });
		fc.assert(
			fc.property(unit, unit, unit, (x, y, z) => {
				const ours = adaptXyz([x, y, z], CULORI_D65, CULORI_D50);
				const theirs = convertXyz65ToXyz50({ x, y, z });
				expect(Math.abs(ours[0] - theirs.x)).toBeLessThan(1e-6);
				expect(Math.abs(ours[1] - theirs.y)).toBeLessThan(1e-6);
				expect(Math.abs(ours[2] - theirs.z)).toBeLessThan(1e-6);
			})
		);
	});

	it('maps the source white onto the destination white, and is the identity for equal whites', () => {
		// definition of a von Kries-type transform
		const a = xyzFromXy(xyFromCct(3200));
		const mapped = adaptXyz(a, a, SRGB_WHITE_XYZ);
		mapped.forEach((v, i) => expect(v).toBeCloseTo(SRGB_WHITE_XYZ[i], 12));
		bradfordMatrix(a, a).forEach((row, i) => row.forEach((v, j) => expect(v).toBeCloseTo(i === j ? 1 : 0, 12)));
	});
});

describe('renderedSwatch', () => {
	it('renders 18 % grey as neutral #767676 when the white balance matches the light', () => {
		// IEC 61966-2-1 transfer: 18 % linear → 117.6 → 0x76
		for (const k of [2000, 3200, 4000, 5500, 6500, 10000]) {
			expect(renderedSwatch({ lightK: k, cameraWbK: k })).toBe('#767676');
		}
		fc.assert(
			fc.property(fc.double({ min: 1667, max: 25000, noNaN: true }), (k) => {
				expect(renderedSwatch({ lightK: k, cameraWbK: k })).toBe('#767676');
			})
		);
		expect(renderedSwatch({ lightK: 5500, cameraWbK: 5500, reflectance: 1 })).toBe('#ffffff');
	});

	it('renders daylight blue and a full-CTO flash near neutral with a 3200 K white balance', () => {
		// common practice, no published source: tungsten WB + CTO on the flash turns the daylight background blue
		const [r, g, b] = channels(renderedSwatch({ lightK: 5500, cameraWbK: 3200 }));
		expect(b - r).toBeGreaterThan(60);
		const gelled = channels(renderedSwatch({ lightK: applyGel(5500, 'full-cto'), cameraWbK: 3200 }));
		expect(Math.max(...gelled) - Math.min(...gelled)).toBeLessThan(20);
		expect(gelled[0]).toBeGreaterThanOrEqual(gelled[2]);
		expect(g).toBeGreaterThan(0);
	});

	it('gets warmer as the light gets warmer than the white balance', () => {
		const ratio = (k: number) => {
			const [r, , b] = channels(renderedSwatch({ lightK: k, cameraWbK: 5000 }));
			return r / Math.max(b, 1);
		};
		expect(ratio(3000)).toBeGreaterThan(ratio(4000));
		expect(ratio(4000)).toBeGreaterThan(ratio(5000));
		expect(ratio(5000)).toBeGreaterThan(ratio(8000));
	});

	it('agrees with culori doing the XYZ → sRGB → hex step', () => {
		// culori 4 xyz65 → rgb and formatHex as an independent reference for the output leg (±1 per channel)
		for (const [lightK, cameraWbK] of [[5500, 3200], [3200, 5500], [4500, 6000], [2800, 3400]]) {
			const light = xyzFromXy(xyFromCct(lightK));
			const card: Xyz = [light[0] * 0.18, light[1] * 0.18, light[2] * 0.18];
			const [x, y, z] = adaptXyz(card, xyzFromXy(xyFromCct(cameraWbK)), SRGB_WHITE_XYZ);
			const expected = channels(formatHex(toRgb({ mode: 'xyz65', x, y, z })));
			const ours = channels(renderedSwatch({ lightK, cameraWbK }));
			ours.forEach((v, i) => expect(Math.abs(v - expected[i])).toBeLessThanOrEqual(1));
		}
	});

	it('stays a valid colour for extreme mismatches', () => {
		expect(renderedSwatch({ lightK: 1667, cameraWbK: 25000 })).toMatch(/^#[0-9a-f]{6}$/);
		expect(renderedSwatch({ lightK: 25000, cameraWbK: 1667 })).toMatch(/^#[0-9a-f]{6}$/);
	});

	it('rejects temperatures outside the locus approximation', () => {
		expect(() => renderedSwatch({ lightK: 1000, cameraWbK: 5000 })).toThrow(ExposureInputError);
		expect(() => renderedSwatch({ lightK: 5000, cameraWbK: 5000, reflectance: 0 })).toThrow(ExposureInputError);
	});
});

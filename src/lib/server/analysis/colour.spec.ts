import { describe, expect, it } from 'vitest';
import { ILLUMINANT_D65, xyFromCct, xyzFromXy, xyzToLinearSrgb } from '../../exposure/index';
import { measureColour, uvFromXy } from './colour';
import type { LinearRgb } from './pixels';

function rgbOfCct(k: number): LinearRgb {
	return xyzToLinearSrgb(xyzFromXy(xyFromCct(k), 0.2)) as LinearRgb;
}

describe('uvFromXy', () => {
	it('matches the CIE 1960 UCS coordinates of D65', () => {
		// CIE 015:2004 Table T.3: D65 u′ = 0.1978, v′ = 0.4683; CIE 1960 v = (2/3)·v′ = 0.3122
		const { u, v } = uvFromXy(ILLUMINANT_D65.x, ILLUMINANT_D65.y);
		expect(u).toBeCloseTo(0.1978, 4);
		expect(v).toBeCloseTo(0.3122, 4);
	});
});

describe('measureColour', () => {
	it('reads colours on the Planckian locus back at their temperature', () => {
		// McCamy (1992) is good to a few kelvin from about 2800 to 6500 K, weaker beyond (REFERENCES.md)
		for (const k of [3200, 4300, 5600]) {
			const c = measureColour(rgbOfCct(k), 0.2);
			expect(Math.abs((c.cct ?? 0) - k), `${k} K`).toBeLessThan(k * 0.01);
			expect(Math.abs(c.duv ?? 1), `${k} K`).toBeLessThan(0.002);
		}
	});

	it('places sRGB white a little above the locus, as D65 is', () => {
		// D65 sits about +0.003 in Duv above the Planckian locus (commonly quoted; from memory)
		const c = measureColour([0.5, 0.5, 0.5], 0.5);
		expect(c.duv).toBeGreaterThan(0.001);
		expect(c.duv).toBeLessThan(0.006);
	});

	it('refuses a temperature for colours far from any white light', () => {
		// beyond the locus ends (1667–25 000 K) there is no temperature and no Duv at all
		const saturatedBlue = measureColour([0.01, 0.02, 0.5], 0.05);
		expect(saturatedBlue).toEqual({ cct: null, duv: null });
		expect(measureColour([0.3, 0.02, 0.02], 0.08).cct).toBeNull();
		// a green tint near 5000 K: inside the range, but more than 0.02 from the locus in uv
		const green = measureColour([0.18, 0.3, 0.15], 0.25);
		expect(green.cct).toBeNull();
		expect(green.duv).toBeGreaterThan(0.02);
	});

	it('gives nothing for a region too dark to have a colour', () => {
		expect(measureColour([0.001, 0.001, 0.002], 0.001)).toEqual({ cct: null, duv: null });
	});
});

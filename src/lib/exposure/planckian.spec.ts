import { converter } from 'culori';
import { describe, expect, it } from 'vitest';
import { cctDuvFromXy, uvFromXy } from './planckian';

const toXyz = converter('xyz65');

describe('uvFromXy', () => {
	it('matches the CIE 1960 UCS coordinates of D65', () => {
		// CIE 015:2004 Table T.3: D65 u′ = 0.1978, v′ = 0.4683; CIE 1960 v = (2/3)·v′ = 0.3122
		const { u, v } = uvFromXy(0.31271, 0.32902);
		expect(u).toBeCloseTo(0.1978, 4);
		expect(v).toBeCloseTo(0.3122, 4);
	});
});

describe('cctDuvFromXy (nearest point on the Planckian locus)', () => {
	// Published CCTs: D65 6504 K, D50 5003 K, illuminant A 2856 K (CIE 015:2004); Duv of D65 and D50 about +0.0032
	// (Ohno, LEUKOS 10(1), 2014, from memory). The Kang et al. (2002) locus approximation costs up to ~10 K.
	it.each([
		['D65', 0.31271, 0.32902, 6504, 0.0032],
		['D50', 0.34567, 0.3585, 5003, 0.0033],
		['A', 0.44757, 0.40745, 2856, 0]
	])('reads %s at its published CCT and Duv', (_name, x, y, k, duv) => {
		const got = cctDuvFromXy(x, y);
		expect(got).not.toBeNull();
		expect(Math.abs(got!.cct - k)).toBeLessThan(15);
		expect(Math.abs(got!.duv - duv)).toBeLessThan(0.0004);
	});

	it('gives the sign of Duv: below the locus (towards magenta) is negative', () => {
		// D65 moved 0.01 down in v (CIE 1960) crosses the locus (D65 sits only ~0.003 above it) and ends below;
		// the locus is tilted in uv, so the perpendicular distance is less than the 0.0068 left over
		const { u, v } = uvFromXy(0.31271, 0.32902);
		const v2 = v - 0.01;
		// invert CIE 1960: x = 3u / (2u − 8v + 4), y = 2v / (2u − 8v + 4)
		const d = 2 * u - 8 * v2 + 4;
		const got = cctDuvFromXy((3 * u) / d, (2 * v2) / d)!;
		expect(got.duv).toBeLessThan(-0.001);
		expect(got.duv).toBeGreaterThan(-0.0068);
	});

	it('reads sRGB white (culori) as D65', () => {
		// culori's sRGB → XYZ (D65) is an independent implementation of IEC 61966-2-1
		const w = toXyz({ mode: 'rgb', r: 1, g: 1, b: 1 });
		const s = w.x + w.y + w.z;
		expect(Math.abs(cctDuvFromXy(w.x / s, w.y / s)!.cct - 6504)).toBeLessThan(15);
	});

	it('has no temperature beyond the locus ends: deep blue sky and candle-red', () => {
		// culori: a strongly blue sRGB colour, far cooler than 25 000 K
		const b = toXyz({ mode: 'rgb', r: 0.35, g: 0.5, b: 1 });
		const s = b.x + b.y + b.z;
		expect(cctDuvFromXy(b.x / s, b.y / s)).toBeNull();
		expect(cctDuvFromXy(0.6, 0.38)).toBeNull();
	});
});

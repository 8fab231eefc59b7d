// Apparent colour temperature of a region, trusted only near the Planckian locus, where a temperature means something.
import { apparentCct, linearSrgbToXyz, PLANCKIAN_RANGE_K, xyFromCct, xyFromXyz } from '../../exposure/index';
import type { LinearRgb } from './pixels';

export interface RegionColour {
	/** K, or null when the region is too dark or too far from any white light to have one. */
	cct: number | null;
	/** Signed distance from the Planckian locus in CIE 1960 uv (+ above, towards green); null when dark. */
	duv: number | null;
}

// Below about code 12 the colour of a region is noise and compression, not light.
// common practice, no published source
export const MIN_LUMINANCE_FOR_COLOUR = 0.0035;
// CIE 015:2004 advises against quoting a CCT for chromaticities more than 5·10⁻² from the locus in uv (from memory)
export const MAX_DUV = 0.05;

/** CIE 1960 UCS (u, v) from CIE 1931 (x, y): u = 4x / (−2x + 12y + 3), v = 6y / (−2x + 12y + 3). */
export function uvFromXy(x: number, y: number): { u: number; v: number } {
	const d = -2 * x + 12 * y + 3;
	return { u: (4 * x) / d, v: (6 * y) / d };
}

export function measureColour(rgb: LinearRgb, luminance: number): RegionColour {
	if (!(luminance >= MIN_LUMINANCE_FOR_COLOUR)) return { cct: null, duv: null };
	try {
		const xy = xyFromXyz(linearSrgbToXyz(rgb));
		const k = apparentCct(rgb);
		if (!xy || k === null || !Number.isFinite(k) || k <= 0) return { cct: null, duv: null };
		// The locus approximation stops at its range ends; beyond them the end point is the nearest locus point
		const onLocus = xyFromCct(Math.min(PLANCKIAN_RANGE_K.max, Math.max(PLANCKIAN_RANGE_K.min, k)));
		const here = uvFromXy(xy.x, xy.y);
		const there = uvFromXy(onLocus.x, onLocus.y);
		const duv = Math.sign(here.v - there.v) * Math.hypot(here.u - there.u, here.v - there.v);
		return { cct: Math.abs(duv) <= MAX_DUV ? k : null, duv };
	} catch {
		return { cct: null, duv: null };
	}
}

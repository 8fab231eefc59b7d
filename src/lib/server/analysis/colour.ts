// Apparent colour temperature of a region: nearest point on the Planckian locus, trusted only near it (|Duv| ≤ 0.02).
import { cctDuvFromXy, linearSrgbToXyz, xyFromXyz } from '../../exposure/index';
import type { LinearRgb } from './pixels';

export { uvFromXy } from '../../exposure/index';

export interface RegionColour {
	/** K, or null when the region is too dark, beyond 1667–25 000 K or too far from any white light to have one. */
	cct: number | null;
	/** Signed distance from the Planckian locus in CIE 1960 uv (+ above, towards green); null when dark or beyond the locus ends. */
	duv: number | null;
}

// Below about code 12 the colour of a region is noise and compression, not light.
// common practice, no published source
export const MIN_LUMINANCE_FOR_COLOUR = 0.0035;
// CIE 015:2004 quotes CCT only within 0.05 of the locus in uv; judging a region's light we are stricter and use
// 0.02 (our choice: beyond it a colour is a tint, not a white light of some temperature).
export const MAX_DUV = 0.02;

export function measureColour(rgb: LinearRgb, luminance: number): RegionColour {
	if (!(luminance >= MIN_LUMINANCE_FOR_COLOUR) || rgb.some((c) => !(c >= 0))) return { cct: null, duv: null };
	const xy = xyFromXyz(linearSrgbToXyz(rgb));
	const nearest = xy ? cctDuvFromXy(xy.x, xy.y) : null;
	if (!nearest) return { cct: null, duv: null };
	return { cct: Math.abs(nearest.duv) <= MAX_DUV ? nearest.cct : null, duv: nearest.duv };
}

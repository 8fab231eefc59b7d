// CCT and Duv of a chromaticity as the nearest point on the Planckian locus in CIE 1960 uv (Robertson 1968, Ohno 2014).
import { requireFinite } from './errors';
import { PLANCKIAN_RANGE_K, xyFromCct } from './chromaticity';

/** CIE 1960 UCS (u, v) from CIE 1931 (x, y): u = 4x / (−2x + 12y + 3), v = 6y / (−2x + 12y + 3). */
export function uvFromXy(x: number, y: number): { u: number; v: number } {
	const d = -2 * requireFinite('x', x) + 12 * requireFinite('y', y) + 3;
	return { u: (4 * x) / d, v: (6 * y) / d };
}

/** A correlated colour temperature with its distance from the locus. */
export interface CctDuv {
	/** kelvin, 1667–25 000 */
	cct: number;
	/** signed distance from the locus in CIE 1960 uv; + above it (towards green), − below (towards magenta) */
	duv: number;
}

// Search in mireds, where the locus is evenly spread; the ends are the Kang et al. (2002) range.
const MIRED_MIN = 1e6 / PLANCKIAN_RANGE_K.max;
const MIRED_MAX = 1e6 / PLANCKIAN_RANGE_K.min;
const SCAN_STEPS = 120;

function locusUv(mired: number): { u: number; v: number } {
	const p = xyFromCct(1e6 / mired);
	return uvFromXy(p.x, p.y);
}

function distance2(u: number, v: number, mired: number): number {
	const p = locusUv(mired);
	return (u - p.u) ** 2 + (v - p.v) ** 2;
}

/**
 * Nearest point on the Planckian locus (Kang et al. 2002 approximation) to a chromaticity, searched
 * in uv as Robertson (1968) and Ohno (2014) define CCT. null when the nearest point is an end of the
 * 1667–25 000 K range (the colour lies beyond it), where no temperature is defined.
 */
export function cctDuvFromXy(x: number, y: number): CctDuv | null {
	const { u, v } = uvFromXy(x, y);
	if (!Number.isFinite(u) || !Number.isFinite(v)) return null;
	const step = (MIRED_MAX - MIRED_MIN) / SCAN_STEPS;
	let best = 0;
	let bestD = Infinity;
	for (let i = 0; i <= SCAN_STEPS; i++) {
		const d = distance2(u, v, MIRED_MIN + i * step);
		if (d < bestD) [best, bestD] = [i, d];
	}
	if (best === 0 || best === SCAN_STEPS) return null;
	// golden-section refinement inside the bracketing scan steps
	let lo = MIRED_MIN + (best - 1) * step;
	let hi = MIRED_MIN + (best + 1) * step;
	const g = (Math.sqrt(5) - 1) / 2;
	for (let k = 0; k < 40; k++) {
		const a = hi - g * (hi - lo);
		const b = lo + g * (hi - lo);
		if (distance2(u, v, a) < distance2(u, v, b)) hi = b;
		else lo = a;
	}
	const mired = (lo + hi) / 2;
	const p = locusUv(mired);
	// towards higher K the locus runs down and to the left in uv; "above" is the left of that direction, negated
	const tangent = locusUv(mired - 1e-3);
	const cross = (tangent.u - p.u) * (v - p.v) - (tangent.v - p.v) * (u - p.u);
	const duv = -Math.sign(cross) * Math.sqrt((u - p.u) ** 2 + (v - p.v) ** 2);
	return { cct: 1e6 / mired, duv };
}

// The reference/lit pair a criterion compares, measured once per grading and shared by every criterion that needs it.
import { cctDuvFromXy, ev100, linearSrgbToXyz, mired, xyFromXyz } from '../../../exposure/index';
import type { Frame } from '../../analysis/index';
import { measurePair, type PairMeasure, type PairResult } from './measure';

export type { PairMeasure, PairResult } from './measure';
export { calibrate, curveCanExplain, CURVE_RANGE } from './calibration';
export { MIN_CURVE_SPAN } from './comparametric';

// the same domain as a region's colour temperature (analysis/colour.ts): |Duv| ≤ 0.02 inside 1667–25 000 K
const MAX_DUV = 0.02;

/** Mired of the nearest Planckian point of a linear sRGB colour; null beyond the locus or too far from it. */
export function miredOf(rgb: [number, number, number]): number | null {
	if (!rgb.every((c) => c > 0 && Number.isFinite(c))) return null;
	const xy = xyFromXyz(linearSrgbToXyz(rgb));
	const nearest = xy ? cctDuvFromXy(xy.x, xy.y) : null;
	return nearest && Math.abs(nearest.duv) <= MAX_DUV ? mired(nearest.cct) : null;
}

/** Stops less light the lit frame's settings give than the reference's (Exif); null when a setting is missing. */
export function settingsDrop(ref: Frame, lit: Frame): number | null {
	const a = ref.exif;
	const b = lit.exif;
	if (a.exposureTime === null || a.fNumber === null || a.iso === null) return null;
	if (b.exposureTime === null || b.fNumber === null || b.iso === null) return null;
	return ev100({ aperture: b.fNumber, shutter: b.exposureTime, iso: b.iso }) - ev100({ aperture: a.fNumber, shutter: a.exposureTime, iso: a.iso });
}

const cache = new WeakMap<Frame, WeakMap<Frame, PairResult>>();

/** The pair's measures (cached per pair of frame objects); 'ok: false' says why they cannot be compared. */
export function pairOf(ref: Frame, lit: Frame): PairResult {
	const hit = cache.get(ref)?.get(lit);
	if (hit) return hit;
	let result: PairResult;
	if (!ref.pixels || !lit.pixels) result = { ok: false, reason: 'the pixels of one of the frames could not be measured' };
	else result = measurePair(ref.pixels, lit.pixels, lit.pixels.subjectBox, settingsDrop(ref, lit), miredOf);
	const inner = cache.get(ref) ?? new WeakMap<Frame, PairResult>();
	inner.set(lit, result);
	cache.set(ref, inner);
	return result;
}

/** Flash over ambient on the subject in stops, from the lift: the r with mix(0, r) = lift, i.e. log2(2^lift − 1). */
export function ratioFromLift(lift: number): number {
	return lift <= 0 ? -Infinity : Math.log2(2 ** lift - 1);
}

/** The range of flash:ambient ratios (stops) a lift allows: −Infinity is "no flash", +Infinity "no upper limit". */
export interface RatioRange {
	low: number;
	high: number;
}

/**
 * The flash:ambient ratio's range from the lift ± its uncertainty, through ratioFromLift (the ratio is steep where the
 * lift is small: a tenth of a stop of lift is a stop of ratio at a quarter-stop lift). A lift within its uncertainty of
 * the cell threshold rests on the cells above it, so the low end opens ("no flash" cannot be ruled out from the ratio);
 * a lift that is only a lower bound leaves the high end open. `uncertainty` is the lift's (by default all of it). null
 * without a lift.
 */
export function ratioRange(
	pair: Pick<PairMeasure, 'lift' | 'liftUncertainty' | 'liftIsLowerBound' | 'cellThreshold'>,
	uncertainty = pair.liftUncertainty
): RatioRange | null {
	if (pair.lift === null) return null;
	const lowLift = pair.lift - uncertainty;
	return {
		low: lowLift <= pair.cellThreshold ? -Infinity : ratioFromLift(lowLift),
		high: pair.liftIsLowerBound ? Infinity : ratioFromLift(pair.lift + uncertainty)
	};
}

/** The flash's share of the subject's light, 0–1, from the lift: 1 − 2^−lift. */
export function shareFromLift(lift: number): number {
	return lift <= 0 ? 0 : 1 - 2 ** -lift;
}

export type { PairMeasure as Pair };

/** Why the pair has no lift, as a sentence for the learner (the reference clipped on the subject, or nothing measurable). */
export function noLiftReason(pair: PairMeasure): string {
	return pair.liftUnknownReason
		? `${pair.liftUnknownReason.charAt(0).toUpperCase()}${pair.liftUnknownReason.slice(1)}.`
		: 'No part of the subject box could be measured in both frames (it is clipped or too dark).';
}

/** When most of a lift's uncertainty comes from the tone curve, the sentence that says so; '' otherwise. */
export function curveDoubtNote(pair: PairMeasure): string {
	return pair.curveDoubt > 0.5 * pair.liftUncertainty
		? ' Most of that uncertainty is the camera’s tone curve: the background darkened by a different amount than the settings say, and the file cannot tell a picture style from an edited frame.'
		: '';
}

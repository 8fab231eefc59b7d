// Slider positions in thirds of a stop from f/1, 1 s and ISO 100, and the marked value at each position.
import { nearestMarked, type MarkedValue, type SeriesKind } from '$lib/exposure';

// Aperture stops are 2·log2(N), shutter stops −log2(t), ISO stops log2(S/100); a position is three per stop.
const TO_STOPS: Record<SeriesKind, (v: number) => number> = {
	aperture: (n) => 2 * Math.log2(n),
	shutter: (t) => -Math.log2(t),
	iso: (s) => Math.log2(s / 100)
};
const FROM_STOPS: Record<SeriesKind, (s: number) => number> = {
	aperture: (s) => 2 ** (s / 2),
	shutter: (s) => 2 ** -s,
	iso: (s) => 100 * 2 ** s
};

/** Nearest slider position (thirds of a stop) of a value (f-number, seconds or ISO). */
export function positionOf(kind: SeriesKind, value: number): number {
	return Math.round(3 * TO_STOPS[kind](value));
}

/** The marked ⅓-stop value at a slider position. */
export function markAt(kind: SeriesKind, position: number): MarkedValue {
	return nearestMarked(FROM_STOPS[kind](position / 3), kind, 1 / 3);
}

/** Slider ends (in positions) for a range of marked values, e.g. rangeOf('shutter', 1/30, 1/8000). */
export function rangeOf(kind: SeriesKind, a: number, b: number): { min: number; max: number } {
	const [p, q] = [positionOf(kind, a), positionOf(kind, b)];
	return { min: Math.min(p, q), max: Math.max(p, q) };
}

/** Keeps a position inside a slider's range. */
export function clampPosition(position: number, range: { min: number; max: number }): number {
	return Math.min(range.max, Math.max(range.min, position));
}

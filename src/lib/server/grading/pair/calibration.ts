// Learns from the background how the camera's tone curve carries an ambient change from the reference to the lit frame.
//
// Method (after Mann's comparametric equations and Debevec & Malik, SIGGRAPH 1997; Mitsunaga & Nayar, CVPR 1999):
// the background is lit by the ambient alone in both frames, so each background cell gives a pair of levels
// (reference, lit) whose scene exposures differ by exactly the Exif settings difference d. From those pairs:
//  - drop(ℓ): how far a cell at reference level ℓ falls in the lit frame: this predicts the ambient-only lit
//    frame for any reference level, whatever the curve, without knowing the curve;
//  - slope(ℓ) = drop / d: how many decoded stops one scene stop is worth around level ℓ (1 for plain sRGB,
//    above 1 in the mid-tones of a contrasty camera curve, below 1 for a flat one).
// Levels are log2 of linear light decoded with the sRGB curve, relative to 18 % grey.
import { median } from './stats';

export interface LevelPair {
	ref: number;
	lit: number;
}

export interface Calibration {
	/** Predicted ambient-only level in the lit frame of a cell at reference level `ref`. */
	predictLit(ref: number): number;
	/** Scene stops between two levels of the lit frame (b above a is positive). */
	sceneStops(a: number, b: number): number;
	/** Median decoded drop over all pairs, stops. */
	medianDrop: number;
	/** Whether the slope could be learned (d far enough from 0); otherwise plain sRGB (slope 1) is assumed. */
	slopeLearned: boolean;
}

// levels are grouped in bins this wide; a bin needs a few cells to say anything
const BIN = 0.5;
const MIN_PER_BIN = 3;
// a settings difference smaller than this tells too little about the slope
const MIN_D_FOR_SLOPE = 0.6;
// the slopes a camera curve can have relative to sRGB. common practice, no published source
const SLOPE_RANGE = [0.4, 2.5] as const;
/**
 * How many times larger or smaller than in plain sRGB a camera's tone curve makes a drop read in the mid-tones, from
 * flat to contrasty picture styles: a background drop beyond this against the settings is more than a curve.
 * common practice, no published source
 */
export const CURVE_RANGE = [0.7, 1.45] as const;

/** Whether a decoded drop against the settings' drop `d` is one a camera curve alone can explain. */
export function curveCanExplain(drop: number, d: number): boolean {
	const ratio = drop / d;
	return ratio >= CURVE_RANGE[0] && ratio <= CURVE_RANGE[1];
}

interface Bin {
	at: number;
	value: number;
}

function binned(points: { x: number; y: number }[]): Bin[] {
	const groups = new Map<number, number[]>();
	for (const p of points) {
		const k = Math.floor(p.x / BIN);
		const list = groups.get(k) ?? [];
		list.push(p.y);
		groups.set(k, list);
	}
	const bins: Bin[] = [];
	for (const [k, ys] of groups) {
		if (ys.length >= MIN_PER_BIN) bins.push({ at: (k + 0.5) * BIN, value: median(ys) });
	}
	return bins.sort((a, b) => a.at - b.at);
}

/** Piecewise-linear through the bins, constant beyond the ends. */
function interpolate(bins: Bin[], fallback: number): (x: number) => number {
	if (bins.length === 0) return () => fallback;
	return (x) => {
		if (x <= bins[0].at) return bins[0].value;
		const last = bins[bins.length - 1];
		if (x >= last.at) return last.value;
		let i = 1;
		while (bins[i].at < x) i++;
		const a = bins[i - 1];
		const b = bins[i];
		return a.value + ((b.value - a.value) * (x - a.at)) / (b.at - a.at);
	};
}

/** `pairs` are background cells usable in both frames; `d` the Exif difference (lit darker is positive), null if unknown. */
export function calibrate(pairs: LevelPair[], d: number | null): Calibration {
	const drops = pairs.map((p) => ({ x: p.ref, y: p.ref - p.lit }));
	const medianDrop = median(drops.map((p) => p.y));
	const drop = interpolate(binned(drops), medianDrop);
	const slopeLearned = d !== null && Math.abs(d) >= MIN_D_FOR_SLOPE;
	let slope: (level: number) => number = () => 1;
	if (slopeLearned) {
		const clamp = (s: number) => Math.min(SLOPE_RANGE[1], Math.max(SLOPE_RANGE[0], s));
		// each pair's slope is the mean slope between its two levels: place it at their midpoint
		const slopes = pairs.map((p) => ({ x: (p.ref + p.lit) / 2, y: clamp((p.ref - p.lit) / (d as number)) }));
		const bins = binned(slopes);
		slope = interpolate(bins, clamp(medianDrop / (d as number)));
	}
	const STEP = 0.05;
	return {
		predictLit: (ref) => ref - drop(ref),
		sceneStops(a, b) {
			const sign = b >= a ? 1 : -1;
			const [lo, hi] = b >= a ? [a, b] : [b, a];
			let sum = 0;
			for (let x = lo; x < hi; x += STEP) {
				const w = Math.min(STEP, hi - x);
				sum += w / slope(x + w / 2);
			}
			return sign * sum;
		},
		medianDrop,
		slopeLearned
	};
}

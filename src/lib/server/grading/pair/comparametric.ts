// How many scene stops the background really darkened, from the two frames' background cells, whatever the camera's
// tone curve (within a family).
//
// Method: comparametric fitting (Mann, "Comparametric equations", IEEE Trans. Image Processing 9(8), 2000). A cell of
// the reference at code v shows scene light q = C⁻¹(v); the same cell in the lit frame shows C(q·2^−D), where C is the
// camera's curve and D the scene drop. Every background cell is lit by the ambient alone, so one C and one D must
// explain every (reference, lit) pair. C is taken as the sRGB curve (IEC 61966-2-1) followed by a picture style on the
// encoded value: a two-parameter family that raises or lowers the mid-tone slope and, separately, the slope near black
// and white (contrasty and flat styles; common practice, no published source). D and the style are fitted together.
// Limits: a curve outside the family, or a background spanning few levels, leaves D and the curve entangled (a flat
// style with a large drop looks like plain sRGB with a smaller one); the fit then only narrows D, and the caller
// weighs it against the plain sRGB reading before deciding anything. Green is used: white balance keeps it fixed.
// What no pair can tell, whatever the fitting: the frames only ever show C(q) and C(q·2^−D), and for any γ > 0 the
// curve C'(q) = C(q^γ) with the drop D' = D/γ gives exactly the same two frames (C'(q·2^−D') = C(q^γ·2^−D)), over
// every level, clipping and black point alike (Mann 2000: the comparametric function fixes the curve only up to such
// an exponent, unless the exposure ratio is known). A flatter or more contrasty picture style is largely such an
// exponent, so a background that drops D under one style looks exactly like one that drops D/γ under another: only
// the family's shape (how far a style can bend before it stops looking like one) separates them, and on the
// evaluation set that is not enough to rule out half a stop for about half of the unedited pairs (plain sRGB ones
// included). An edit of the lit frame's exposure, or an ambient change between frames, is such a D. No other
// statistic of the same two frames (more cells, other channels, the subject's unlit parts) can undo it; only what
// the pixels do not hold can (a known curve, a third frame of known exposure, or trust in the files' provenance).
// (our reasoning from the identity above)
import { srgbDecode, srgbEncode } from '../../../exposure/index';

export interface DropFit {
	/** Best-fitting scene drop, stops (lit darker positive). */
	drop: number;
	/** Mid-tone and end slopes of the fitted picture style against plain sRGB (1 = plain). */
	midSlope: number;
	endSlope: number;
	/** Stops between the 10th and 90th percentile of the reference cells' levels: under MIN_CURVE_SPAN, no curve shows. */
	levelSpan: number;
	/** How much worse (1 = as good) the best style explains the cells with the drop held at `drop` than the best fit. */
	misfitAt(drop: number): number;
	cells: number;
}

// a residual beyond this (encoded units, about 13 codes) counts as this much: a moved or spilled cell
const OUTLIER = 0.05;
const MIN_CELLS = 12;
/**
 * A background spanning less than this (stops, 10th to 90th percentile of its levels; the evaluation set's span 0.7–2) shows no curve, so the fit
 * can rule nothing out or in: callers read such a pair as plain sRGB, trusting a frame straight from the camera.
 * our choice
 */
export const MIN_CURVE_SPAN = 0.4;
const MAX_CELLS = 320;
// a cell mean's noise that no fit can remove (JPEG rounding, texture), encoded units: about one code
const NOISE_FLOOR = 0.004;
// the style's parameter grid: excess slope in the mid-tones and near the ends (against sRGB)
const MID_EXCESS = Array.from({ length: 15 }, (_, i) => 0.07 * (i - 7));
const END_EXCESS = Array.from({ length: 9 }, (_, i) => 0.1 * (i - 4));
const LUT_SIZE = 2048;

interface Style {
	mid: number;
	end: number;
	/** Encoded value → encoded value before the style (tabulated inverse of the style). */
	inverse: Float64Array;
	/** log2 of scene light (X_MIN…0) → the code the camera writes (sRGB, then the style), tabulated. */
	codeOfLog: Float64Array;
}

// scene light below 2^X_MIN of white is black to an 8-bit file
const X_MIN = -16;

/** v + a cubic and a sine term: slope 1 + mid at v = ½, 1 + end at 0 and 1, ends fixed. */
function styleCurve(mid: number, end: number): (v: number) => number {
	const cubic = -(mid + end);
	const sine = mid - cubic;
	return (v) => v + 4 * cubic * (v - 0.5) * v * (1 - v) - (sine * Math.sin(2 * Math.PI * v)) / (2 * Math.PI);
}

function tabulateInverse(forward: (v: number) => number): Float64Array | null {
	const fine = 8 * LUT_SIZE;
	const ys = new Float64Array(fine + 1);
	for (let i = 0; i <= fine; i++) {
		ys[i] = forward(i / fine);
		if (i > 0 && ys[i] < ys[i - 1]) return null;
	}
	const inverse = new Float64Array(LUT_SIZE + 1);
	let j = 0;
	for (let k = 0; k <= LUT_SIZE; k++) {
		const y = k / LUT_SIZE;
		while (j < fine - 1 && ys[j + 1] < y) j++;
		const step = ys[j + 1] - ys[j];
		inverse[k] = (j + (step > 0 ? Math.min(1, Math.max(0, (y - ys[j]) / step)) : 0)) / fine;
	}
	return inverse;
}

let styles: Style[] | null = null;
function allStyles(): Style[] {
	if (styles) return styles;
	styles = [];
	for (const mid of MID_EXCESS) {
		for (const end of END_EXCESS) {
			const forward = styleCurve(mid, end);
			const inverse = tabulateInverse(forward);
			if (!inverse) continue;
			const codeOfLog = Float64Array.from({ length: LUT_SIZE + 1 }, (_, i) => forward(srgbEncode(2 ** (X_MIN + (-X_MIN * i) / LUT_SIZE))));
			styles.push({ mid, end, inverse, codeOfLog });
		}
	}
	return styles;
}

/** Encoded value (0–1) → log2 of the linear light the sRGB curve gives it. */
const LOG_OF_CODE = Float64Array.from({ length: LUT_SIZE + 1 }, (_, i) => Math.max(X_MIN, Math.log2(srgbDecode(i / LUT_SIZE))));

const lookup = (table: Float64Array, v: number) => {
	const x = Math.min(1, Math.max(0, v)) * LUT_SIZE;
	const i = Math.min(LUT_SIZE - 1, Math.floor(x));
	return table[i] + (table[i + 1] - table[i]) * (x - i);
};

const codeAt = (style: Style, log: number) => lookup(style.codeOfLog, (Math.min(0, log) - X_MIN) / -X_MIN);

/** Robust squared error of predicting the lit codes from the scene light behind the reference codes (log2). */
function misfit(style: Style, sceneLog: Float64Array, lit: Float64Array, drop: number): number {
	let sum = 0;
	for (let i = 0; i < sceneLog.length; i++) {
		const e = codeAt(style, sceneLog[i] - drop) - lit[i];
		sum += Math.min(e * e, OUTLIER * OUTLIER);
	}
	return sum;
}

/** Golden-section minimum of f near `start` (within ±step). */
function refine(f: (x: number) => number, start: number, step: number): { x: number; y: number } {
	let a = start - step;
	let b = start + step;
	const g = (Math.sqrt(5) - 1) / 2;
	let c = b - g * (b - a);
	let d = a + g * (b - a);
	let fc = f(c);
	let fd = f(d);
	for (let n = 0; n < 14; n++) {
		if (fc < fd) {
			b = d;
			d = c;
			fd = fc;
			c = b - g * (b - a);
			fc = f(c);
		} else {
			a = c;
			c = d;
			fc = fd;
			d = a + g * (b - a);
			fd = f(d);
		}
	}
	const x = (a + b) / 2;
	return { x, y: f(x) };
}

/** The minimum of a parabola through the lowest scanned point and its neighbours (the point itself at an end). */
function parabolicMinimum(xs: number[], ys: number[]): { x: number; y: number } {
	let k = 0;
	for (let i = 1; i < ys.length; i++) if (ys[i] < ys[k]) k = i;
	if (k === 0 || k === ys.length - 1) return { x: xs[k], y: ys[k] };
	const [a, b, c] = [ys[k - 1], ys[k], ys[k + 1]];
	const curvature = a - 2 * b + c;
	if (curvature <= 0) return { x: xs[k], y: b };
	const t = (0.5 * (a - c)) / curvature;
	return { x: xs[k] + t * (xs[k + 1] - xs[k]), y: b - 0.25 * (a - c) * t };
}

// the drop is scanned this coarsely over ±SPAN around the settings for every style, then refined for the best few
const SCAN_STEP = 0.25;
const SPAN = 2.5;
const REFINED = 24;


/**
 * `ref` and `lit` are the green linear-light means (0–1) of background cells usable in both frames; `settings` the
 * Exif drop in stops when known. null when too few cells.
 */
export function fitSceneDrop(ref: readonly number[], lit: readonly number[], settings: number | null): DropFit | null {
	const all = Math.min(ref.length, lit.length);
	if (all < MIN_CELLS) return null;
	// an even sample across the reference's levels: more cells add time, not information about the curve
	const order = Array.from({ length: all }, (_, i) => i).sort((a, b) => ref[a] - ref[b]);
	const picked = all <= MAX_CELLS ? order : Array.from({ length: MAX_CELLS }, (_, k) => order[Math.floor((k * all) / MAX_CELLS)]);
	const n = picked.length;
	const refCodes = Float64Array.from(picked, (i) => srgbEncode(ref[i]));
	const litCodes = Float64Array.from(picked, (i) => srgbEncode(lit[i]));
	const centre = settings ?? 1.5;
	const scanned = allStyles().map((style) => {
		const sceneLog = refCodes.map((v) => lookup(LOG_OF_CODE, lookup(style.inverse, v)));
		const drops: number[] = [];
		const errors: number[] = [];
		for (let drop = centre - SPAN; drop <= centre + SPAN + 1e-9; drop += SCAN_STEP) {
			drops.push(drop);
			errors.push(misfit(style, sceneLog, litCodes, drop));
		}
		const at = parabolicMinimum(drops, errors);
		return { style, sceneLog, at };
	});
	let best: { style: Style; drop: number; error: number } | null = null;
	for (const s of [...scanned].sort((a, b) => a.at.y - b.at.y).slice(0, REFINED)) {
		const found = refine((drop) => misfit(s.style, s.sceneLog, litCodes, drop), s.at.x, SCAN_STEP);
		if (!best || found.y < best.error) best = { style: s.style, drop: found.x, error: found.y };
	}
	if (!best) return null;
	const floor = n * NOISE_FLOOR ** 2;
	const bestError = best.error;
	const misfitAt = (drop: number) => (Math.min(...scanned.map((s) => misfit(s.style, s.sceneLog, litCodes, drop))) + floor) / (bestError + floor);
	const levels = picked.map((i) => Math.log2(Math.max(ref[i], 1e-6)));
	const levelSpan = levels[Math.floor(0.9 * (n - 1))] - levels[Math.floor(0.1 * (n - 1))];
	return {
		levelSpan,
		misfitAt,
		drop: best.drop,
		midSlope: 1 + best.style.mid,
		endSlope: 1 + best.style.end,
		cells: all
	};
}

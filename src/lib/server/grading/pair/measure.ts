// Measures what the flash added: the lit frame against the ambient reference, cell by cell, in linear light.
//
// The reference shows the scene in ambient light only. Learned from the background (calibration.ts), it predicts
// the ambient-only lit frame; whatever the lit frame holds above that prediction is the flash's (Petschnigg et al.
// and Eisemann & Durand, SIGGRAPH 2004: the flash's contribution is the difference in linear light). The subject's
// lift is measured against the same subject in the reference, so dark skin and dark kit are measured as fairly as
// light ones, and the subject box is only a search area: the lift is an upper-middle quantile (LIFT_QUANTILE) of the
// cells the flash changed, since cells on the subject's outline mix in background.
// Tone curves: the background's drop against the settings teaches how the camera's curve stretches a change, and the
// lift is read through that. The pair cannot tell a curve from an edited frame (a flat picture style can hide a frame
// darkened by a stop), so the lift read as plain sRGB is kept too and the gap between the two readings is added to
// the uncertainty (curveDoubt); when the drop is beyond anything a curve does, the plain reading is the estimate. The
// background's scene drop is also fitted with the curve (comparametric.ts); when that fit cannot rule out an ambient
// change half a stop off the settings, the learned curve may be off too, and the lift's uncertainty says so.
// Cells clipped in the reference cannot be compared: when they may hold more of the subject than was measured, the
// lift is null with its reason. Blown cells give a lower bound: the least lift that takes one channel to clipping.
// Limits: the frames must show the same scene from the same place (a tripod or a steady hand: cells are ~2.5 % of
// the frame); subject movement between frames blurs the measure; the flash must not light the background; white
// balance must be the same in both frames; clipped and crushed cells cannot be measured and are left out and counted.
import { srgbDecode } from '../../../exposure/index';
import { CLIP_CODE, cellPlaces, decodeGrid, type Box, type Cells, type PixelReport } from '../../analysis/index';
import { calibrate, curveCanExplain, type Calibration, type LevelPair } from './calibration';
import { fitSceneDrop, MIN_CURVE_SPAN, type DropFit } from './comparametric';
import { median, quantile, robustSpread } from './stats';

export interface PairMeasure {
	/** Exif settings difference, stops (+ = lit frame darker); null when Exif cannot tell. */
	expectedDrop: number | null;
	/** Median darkening of the background cells from reference to lit, in sRGB-decoded stops (green: white balance keeps it). */
	backgroundDrop: number;
	/** The background's darkening in scene stops, fitted with the camera's curve (comparametric.ts); null when too few cells. */
	sceneDrop: DropFit | null;
	/** Robust spread of the background cells' darkening, stops: large when the frames do not show the same scene. */
	backgroundSpread: number;
	backgroundCells: number;
	/** Share (0–1) of the background cells that could be compared (neither clipped nor crushed in either frame). */
	backgroundUsable: number;
	/** Whether the curve's slope was learned from the pair; otherwise plain sRGB was assumed. */
	slopeLearned: boolean;
	/** Stops the flash lifted the subject above the ambient alone (scene stops); null when no subject cell is usable. */
	lift: number | null;
	/** ± stops this lift may be off by: noise of the background cells plus the tone curve's uncertainty. */
	liftUncertainty: number;
	/** true when most of the flash-lit subject is blown out: the lift is then only a lower bound. */
	liftIsLowerBound: boolean;
	/**
	 * Stops the lift could be off by because the pair cannot tell a camera curve from an edited frame: the lift read
	 * with the curve learned from the background, against the lift read as plain sRGB (included in liftUncertainty).
	 */
	curveDoubt: number;
	/** Why no lift could be measured although the box holds a subject (it is clipped in the reference); null otherwise. */
	liftUnknownReason: string | null;
	/**
	 * Least lift a cell needs to count as flash-lit (stops). A lift measured within its uncertainty of this rests on the
	 * cells the threshold let through, the top of the subject's spread, so the subject's own lift may be lower.
	 */
	cellThreshold: number;
	/** Cells judged to be the flash-lit subject (and of the box, usable). */
	subjectCells: number;
	boxCells: number;
	/** Share of the flash-lit subject the flash blew out (clipped in the lit frame, not in the reference). */
	blownShare: number;
	/** Mireds warmer the light on the subject is than the ambient (flash and ambient mixed, against ambient alone); null when unmeasurable. */
	warmerMired: number | null;
	/** Lift of each colour channel, stops (R, G, B); null when unmeasurable. */
	channelLift: [number, number, number] | null;
}

export type PairResult = { ok: true; pair: PairMeasure } | { ok: false; reason: string };

// A cell is compared only when almost all its pixels are usable in both frames.
const MAX_CLIPPED = 0.02;
const MAX_CRUSHED = 0.02;
// about code 12 in sRGB: below it JPEG noise and the curve's toe swamp the level. common practice, no published source
const MIN_LEVEL = Math.log2(0.0037 / 0.18);
const MIN_BACKGROUND_CELLS = 12;
// the level of code 250 in every channel, where clipping starts (CLIP_CODE): IEC 61966-2-1 decode, stops over 18 % grey
const CLIP_LEVEL = Math.log2(srgbDecode(CLIP_CODE / 255) / 0.18);
// least lift that marks a cell as lit by the flash
const MIN_CELL_LIFT = 0.3;
// a cell blown by the flash: mostly clipped in the lit frame, nearly clean in the reference
const BLOWN_LIT = 0.25;
const BLOWN_REF = 0.05;
// how much slope uncertainty remains when the slope could not be learned (a camera curve against sRGB)
const UNLEARNED_SLOPE_DOUBT = 0.3;
// The lift is read at this quantile of the flash-lit cells: cells on the subject's outline mix in background and
// read low, and the subject box is a search area, so a median of every lit cell lies below the subject's own lift.
// Chosen on the evaluation set (src/lib/server/evaluation), where it removes that bias.
const LIFT_QUANTILE = 0.65;
// an ambient change this far from the settings must be ruled out by the background (the fit explaining the cells this
// many times worse with the drop held there) before the curve learned from it is trusted for the lift; our choice
const LOOSE_DROP = 0.5;
const DROP_PINNED = 2;
// least measuring uncertainty of a lift (JPEG noise, cell mixing), stops. our estimate from the evaluation set
const BASE_UNCERTAINTY = 0.12;

type Channel = 'r' | 'g' | 'b' | 'y';

function level(cells: Cells, i: number, channel: Channel): number {
	const v = channel === 'y' ? 0.2126 * cells.r[i] + 0.7152 * cells.g[i] + 0.0722 * cells.b[i] : cells[channel][i];
	return v > 0 ? Math.log2(v / 0.18) : NaN;
}

function usable(cells: Cells, i: number): boolean {
	return cells.clipped[i] <= MAX_CLIPPED && cells.crushed[i] <= MAX_CRUSHED && Number.isFinite(cells.r[i]);
}

interface ChannelMeasure {
	calibration: Calibration;
	cellLift: (i: number) => number;
	/** The same lift read as plain sRGB (one decoded stop is one scene stop): the edited-frame reading. */
	plainLift: (i: number) => number;
	backgroundLifts: number[];
	pairs: LevelPair[];
}

// Each channel predicts its own ambient-only level (that takes in a white balance changed between frames), but the
// tone curve's slope is the luminance's: a channel's drop mixes the curve with the white balance and cannot part them.
function measureChannel(ref: Cells, lit: Cells, background: number[], d: number | null, channel: Channel, slopeFrom?: Calibration): ChannelMeasure | null {
	const pairs: LevelPair[] = [];
	for (const i of background) {
		const a = level(ref, i, channel);
		const b = level(lit, i, channel);
		if (a >= MIN_LEVEL && b >= MIN_LEVEL) pairs.push({ ref: a, lit: b });
	}
	if (pairs.length < MIN_BACKGROUND_CELLS) return null;
	const calibration = calibrate(pairs, d);
	const stops = (slopeFrom ?? calibration).sceneStops;
	const cellLift = (i: number) => {
		const a = level(ref, i, channel);
		const b = level(lit, i, channel);
		if (!(a >= MIN_LEVEL && b >= MIN_LEVEL)) return NaN;
		return stops(calibration.predictLit(a), b);
	};
	const plainLift = (i: number) => {
		const a = level(ref, i, channel);
		const b = level(lit, i, channel);
		if (!(a >= MIN_LEVEL && b >= MIN_LEVEL)) return NaN;
		return b - calibration.predictLit(a);
	};
	return { calibration, cellLift, plainLift, backgroundLifts: pairs.map((p) => stops(calibration.predictLit(p.ref), p.lit)), pairs };
}

/** mired(x) − mired(y) of the light on the subject against the ambient, from per-channel lifts; null off the locus. */
function warmth(lifts: [number, number, number], toMired: (rgb: [number, number, number]) => number | null): number | null {
	const gains = lifts.map((l) => 2 ** l) as [number, number, number];
	const mixed = toMired(gains);
	const ambient = toMired([1, 1, 1]);
	return mixed === null || ambient === null ? null : mixed - ambient;
}

/**
 * Compares two measured frames of the same scene. `d` is the Exif settings difference (lit darker positive).
 * `toMired` turns linear sRGB into the mired of its nearest Planckian point (null beyond the locus).
 */
export function measurePair(
	refPixels: PixelReport,
	litPixels: PixelReport,
	box: Box,
	d: number | null,
	toMired: (rgb: [number, number, number]) => number | null
): PairResult {
	const ref = decodeGrid(refPixels.grid);
	const lit = decodeGrid(litPixels.grid);
	if (!ref || !lit) return { ok: false, reason: 'one of the frames was measured before cell levels were kept, so the two cannot be compared' };
	if (ref.cols !== lit.cols || ref.rows !== lit.rows) {
		return { ok: false, reason: 'the two frames have different shapes (one is turned or cropped), so they cannot be compared point by point' };
	}
	const places = cellPlaces(lit.cols, lit.rows, box);
	const backgroundAll = places.flatMap((p, i) => (p === 'background' ? [i] : []));
	const background = backgroundAll.filter((i) => usable(ref, i) && usable(lit, i));
	const backgroundUsable = backgroundAll.length ? background.length / backgroundAll.length : 0;
	const luma = measureChannel(ref, lit, background, d, 'y');
	if (!luma) {
		const clipped = Math.round(100 * refPixels.background.clippedShare);
		return {
			ok: false,
			reason: `too little of the background can be compared (${Math.round(100 * backgroundUsable)} % of it; ${clipped} % of the reference background is clipped)`
		};
	}
	const greenRef: number[] = [];
	const greenLit: number[] = [];
	for (const i of background) {
		if (level(ref, i, 'g') >= MIN_LEVEL && level(lit, i, 'g') >= MIN_LEVEL) {
			greenRef.push(ref.g[i]);
			greenLit.push(lit.g[i]);
		}
	}
	const drops = greenRef.length >= MIN_BACKGROUND_CELLS ? greenRef.map((v, k) => Math.log2(v / greenLit[k])) : luma.pairs.map((p) => p.ref - p.lit);
	const noise = robustSpread(luma.backgroundLifts);
	const slopeDoubt = luma.calibration.slopeLearned ? 0 : UNLEARNED_SLOPE_DOUBT;

	const boxCells = places.flatMap((p, i) => (p === 'subject' ? [i] : []));
	const lifts = boxCells.map((i) => (usable(ref, i) && usable(lit, i) ? luma.cellLift(i) : NaN));
	const measured = boxCells.map((i, k) => ({ i, lift: lifts[k] })).filter((c) => Number.isFinite(c.lift));
	const threshold = Math.max(MIN_CELL_LIFT, 3 * (Number.isFinite(noise) ? noise : 0));
	const lit_ = measured.filter((c) => c.lift >= threshold);
	// cells the flash blew out: their lift is at least what it takes to reach the clipping level from the prediction
	const blownCells = boxCells.filter((i) => lit.clipped[i] >= BLOWN_LIT && ref.clipped[i] <= BLOWN_REF && Number.isFinite(ref.r[i]));
	// at least one channel of a blown cell reached the clipping level, so its lift is at least the least lift that
	// takes one of its channels there (a white-balance gain or a gel clips one channel long before the others)
	const channels = (['r', 'g', 'b'] as const).map((c) => measureChannel(ref, lit, background, d, c, luma.calibration));
	// each blown cell's least lift through the learned curve, and read as plain sRGB (the edited-frame reading)
	const leastLifts = blownCells.map((i) => {
		const needs = channels.map((c, k) => {
			const a = level(ref, i, (['r', 'g', 'b'] as const)[k]);
			if (!c || !(a >= MIN_LEVEL)) return { learned: NaN, plain: NaN };
			const from = c.calibration.predictLit(a);
			return { learned: luma.calibration.sceneStops(from, CLIP_LEVEL), plain: CLIP_LEVEL - from };
		});
		const ok = needs.every((n) => Number.isFinite(n.learned));
		return { learned: ok ? Math.min(...needs.map((n) => n.learned)) : NaN, plain: ok ? Math.min(...needs.map((n) => n.plain)) : NaN };
	});
	const usableBlown = leastLifts.filter((l) => Number.isFinite(l.learned) && l.learned >= threshold);
	const blownLifts = usableBlown.map((l) => l.learned);
	const blown = blownCells.length;
	const enough = lit_.length + blownLifts.length >= Math.max(2, 0.05 * (measured.length + blownLifts.length));
	const subject = enough ? lit_ : [];
	// subject cells clipped in the reference cannot be compared: when they outnumber the lit cells found, the subject
	// may be there unmeasured, so neither "no flash" nor the few cells found can stand for it
	// (a clipped sky in a loose box is told apart by its lit level: no more than its reference level predicts, no flash)
	const clippedInReference = boxCells.filter((i) => {
		if (ref.clipped[i] <= MAX_CLIPPED || blownCells.includes(i)) return false;
		if (lit.clipped[i] > MAX_CLIPPED) return true;
		const b = level(lit, i, 'y');
		// clipping only lowers a cell's measured level, so the lift against it is the most the flash can have added;
		// a cell with no level left is at least at the clipping level
		const a = level(ref, i, 'y');
		const atMost = Number.isFinite(a) ? Math.min(a, CLIP_LEVEL) : CLIP_LEVEL;
		return !(b >= MIN_LEVEL) || luma.calibration.sceneStops(luma.calibration.predictLit(atMost), b) >= threshold;
	}).length;
	const liftUnknownReason =
		clippedInReference >= Math.max(2, subject.length + blownLifts.length)
			? `${clippedInReference} of the ${boxCells.length} measuring cells in the subject box are clipped to white in the reference frame, so the flash’s lift cannot be compared there`
			: null;
	const liftIsLowerBound = enough && blownLifts.length >= subject.length;
	const pick = (values: number[]) => quantile(values, LIFT_QUANTILE);
	// most of the subject blown: each blown cell's value is only its least lift, and the median of per-cell least values
	// is a least value of the subject's median (an upper quantile of them is not)
	const pickBound = (values: number[]) => (liftIsLowerBound ? median(values) : pick(values));
	const learned =
		liftUnknownReason !== null || measured.length + blownLifts.length === 0
			? null
			: enough
				? pickBound([...subject.map((c) => c.lift), ...blownLifts])
				: Math.max(0, quantile(measured.map((c) => c.lift), 0.75));
	// the same cells read as plain sRGB: where the background's drop differs from the settings, the pair cannot tell a
	// camera curve (the learned reading) from an edited frame (this reading), so the lift is only known between them
	const plain = enough && subject.length + usableBlown.length ? pickBound([...subject.map((c) => luma.plainLift(c.i)), ...usableBlown.map((l) => l.plain)]) : learned;
	const sceneDrop = fitSceneDrop(greenRef, greenLit, d);
	// when the background cannot rule out an ambient change half a stop off the settings (an edited frame under a
	// flat or contrasty style), the curve learned from it may be off by that much too: the lift with it
	const dropLoose =
		d !== null &&
		sceneDrop !== null &&
		sceneDrop.levelSpan >= MIN_CURVE_SPAN &&
		Math.min(sceneDrop.misfitAt(d - LOOSE_DROP), sceneDrop.misfitAt(d + LOOSE_DROP)) < DROP_PINNED;
	const looseDoubt = dropLoose && learned !== null ? (Math.abs(learned) * LOOSE_DROP) / Math.max(Math.abs(d as number), 1) : 0;
	// (a lower bound read through the wrong curve is no bound, so it carries the same doubt)
	const curveDoubt =
		learned !== null
			? Math.max(plain !== null && luma.calibration.slopeLearned ? Math.abs(learned - plain) : 0, looseDoubt)
			: 0;
	// a background drop no camera curve explains is an edited (or mis-tagged) frame: read the lift as plain sRGB then
	const edited = d !== null && luma.calibration.slopeLearned && !curveCanExplain(luma.calibration.medianDrop, d);
	const lift: number | null = edited && curveDoubt > 0 ? plain : learned;
	const measuringUncertainty =
		BASE_UNCERTAINTY +
		(2 * (Number.isFinite(noise) ? noise : 0.2)) / Math.sqrt(Math.max(1, subject.length || measured.length)) +
		slopeDoubt * Math.abs(learned ?? 0) +
		curveDoubt;
	// too few cells above the threshold to stand for the subject: its lift is below the threshold on nearly all of it,
	// whatever the upper quartile read, so the stated range reaches up to the threshold
	// (the threshold is itself a measured level, good to the least measuring uncertainty)
	const liftUncertainty = learned !== null && !enough ? Math.max(measuringUncertainty, threshold + BASE_UNCERTAINTY - learned) : measuringUncertainty;

	let channelLift: PairMeasure['channelLift'] = null;
	let warmerMired: number | null = null;
	if (subject.length >= 2) {
		if (channels.every((c) => c !== null)) {
			const perChannel = channels.map((c) => median(subject.map((s) => c!.cellLift(s.i)).filter(Number.isFinite)));
			if (perChannel.every(Number.isFinite)) {
				channelLift = perChannel as [number, number, number];
				warmerMired = warmth(channelLift, toMired);
			}
		}
	}

	return {
		ok: true,
		pair: {
			expectedDrop: d,
			backgroundDrop: median(drops),
			sceneDrop,
			backgroundSpread: robustSpread(drops),
			backgroundCells: luma.pairs.length,
			backgroundUsable,
			slopeLearned: luma.calibration.slopeLearned,
			lift,
			liftUncertainty,
			liftIsLowerBound,
			curveDoubt,
			liftUnknownReason,
			cellThreshold: threshold,
			subjectCells: subject.length,
			boxCells: boxCells.length,
			blownShare: subject.length + blown > 0 ? blown / (subject.length + blown) : 0,
			warmerMired,
			channelLift
		}
	};
}

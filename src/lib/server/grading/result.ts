// The shape of a criterion's verdict, and the lookups every criterion shares (frames, Exif fields, pixels).
import type { ExifField, Frame, PixelReport } from '../analysis/index';
import { EXIF_TAG_NAMES } from '../analysis/index';
import type { AssignmentSpec, CriterionKind } from './spec';
import { pairOf, type PairMeasure } from './pair/index';

export type CriterionVerdict = 'pass' | 'fail' | 'unknown';
export type Unit = 'stops' | 'EV' | 's' | 'f-number' | 'ISO' | 'mm' | 'mired' | 'flash' | 'percent' | 'px' | 'judged';
/** How `measured` is compared with `target`: within ± tolerance, at least, at most, or between [min, max]. */
export type Comparison = 'within' | 'at-least' | 'at-most' | 'between';

/** Measured evidence a verdict page shows beside the numbers (all optional; older results have none). */
export interface Evidence {
	/** Stops the flash lifted the subject above the ambient alone. */
	lift?: number;
	/** Share (0–1) of the subject's light that came from the flash. */
	flashShare?: number;
	/** Flash over ambient on the subject, stops. */
	ratioStops?: number;
	/** ± stops the lift may be off by. */
	uncertainty?: number;
	/** The lift predicted from what the learner said they used (guide number, power, distance), stops. */
	predictedLift?: number;
	/** Percent of the flash-lit subject blown out. */
	blownPercent?: number;
	/** true when the lift is only a lower bound (most of the flash-lit subject is blown out). */
	lowerBound?: boolean;
	/** true when the measure (and lift, share, ratio here) is only an upper bound: the pair cannot narrow it further. */
	upperBound?: boolean;
	/** Flash over ambient, stops, known only within this range (null: open end); given instead of a measured ratio when the range is wider than the criterion's tolerance. */
	ratioRange?: [number | null, number | null];
}

export interface CriterionResult {
	kind: CriterionKind;
	verdict: CriterionVerdict;
	measured: number | number[] | null;
	target: number | number[] | null;
	tolerance: number | null;
	unit: Unit;
	comparison: Comparison;
	/** For the learner: what was found and, when it falls short, what to change. */
	message: string;
	/** Exif tags (CIPA DC-008 names) that were missing when that made the verdict unknown. */
	missing: string[];
	/** Frames this criterion looked at. */
	frames: string[];
	/** What the pixels showed, for the verdict page (absent on criteria that read only settings). */
	evidence?: Evidence;
}

/** What the learner says they used (all optional); gives a predicted subject level beside the measured one. */
export interface FlashUsed {
	/** Full-power guide number, metres at ISO 100. */
	gn?: number;
	/** Power as a fraction of full (1/4 = 0.25). */
	power?: number;
	/** Flash-to-subject distance, metres. */
	distance?: number;
}

export interface GradeContext {
	spec: AssignmentSpec;
	frames: Readonly<Record<string, Frame | undefined>>;
	used?: FlashUsed;
}

/** Fields every result of one criterion shares; the evaluator adds verdict, measured and message. */
export type ResultBase = Omit<CriterionResult, 'verdict' | 'measured' | 'message' | 'missing'>;

export function passOrFail(ok: boolean): CriterionVerdict {
	return ok ? 'pass' : 'fail';
}

/** 'the “lit” frame' */
export function frameWords(name: string): string {
	return `the “${name}” frame`;
}

/** Either the frame, or an 'unknown' result saying it was not uploaded. */
export function lookupFrame(ctx: GradeContext, name: string, base: ResultBase): Frame | CriterionResult {
	const frame = ctx.frames[name];
	if (frame) return frame;
	return {
		...base,
		verdict: 'unknown',
		measured: null,
		missing: [],
		message: `${capitalise(frameWords(name))} is missing from this Attempt, so this could not be checked.`
	};
}

/** Tells a lookup's 'unknown' result apart from the value it looked up. */
export function isResult<T extends object>(value: T | CriterionResult): value is CriterionResult {
	return 'verdict' in value && 'kind' in value;
}

type ExifValues<F extends ExifField> = { [K in F]: NonNullable<Frame['exif'][K]> };

/** The named Exif fields of a frame, or an 'unknown' result naming each missing tag. */
export function requireExif<F extends ExifField>(
	frame: Frame,
	name: string,
	fields: readonly F[],
	base: ResultBase
): ExifValues<F> | CriterionResult {
	const absent = fields.filter((f) => frame.exif[f] === null);
	if (absent.length === 0) {
		return Object.fromEntries(fields.map((f) => [f, frame.exif[f]])) as ExifValues<F>;
	}
	const tags = absent.map((f) => EXIF_TAG_NAMES[f]);
	const list = tags.length === 1 ? `${tags[0]} tag` : `${tags.slice(0, -1).join(', ')} or ${tags[tags.length - 1]} tags`;
	return {
		...base,
		verdict: 'unknown',
		measured: null,
		missing: tags,
		message: `${capitalise(frameWords(name))} has no ${list} in its Exif${frame.exif.found ? '' : ' (the file carries no camera settings at all)'}, so this cannot be checked from the file; a mentor will look at it.`
	};
}

/** The frame's pixel measures, or an 'unknown' result saying why they are absent. */
export function requirePixels(frame: Frame, name: string, base: ResultBase): PixelReport | CriterionResult {
	if (frame.pixels) return frame.pixels;
	return {
		...base,
		verdict: 'unknown',
		measured: null,
		missing: [],
		message: `The pixels of ${frameWords(name)} were not measured (${frame.file.label} files cannot be decoded here), so a mentor will judge this by eye.`
	};
}

export function capitalise(text: string): string {
	return text.charAt(0).toUpperCase() + text.slice(1);
}

/** Reference and lit frames with their measured pair, or an 'unknown' result saying why they cannot be compared. */
export function requirePair(
	ctx: GradeContext,
	refName: string | null,
	litName: string,
	base: ResultBase,
	what: string
): { ref: Frame; lit: Frame; pair: PairMeasure } | CriterionResult {
	const unknown = (message: string): CriterionResult => ({ ...base, verdict: 'unknown', measured: null, missing: [], message });
	if (refName === null) {
		return unknown(`${capitalise(what)} is measured against an ambient reference frame (the same scene without flash), and this Assignment has none, so a mentor will judge it by eye.`);
	}
	const lit = lookupFrame(ctx, litName, base);
	if (isResult(lit)) return lit;
	const ref = lookupFrame(ctx, refName, base);
	if (isResult(ref)) return ref;
	for (const [frame, name] of [[lit, litName], [ref, refName]] as const) {
		const pixels = requirePixels(frame, name, base);
		if (isResult(pixels)) return pixels;
	}
	const result = pairOf(ref, lit);
	if (!result.ok) return unknown(`${capitalise(what)} could not be measured: ${result.reason}. A mentor will compare the frames by eye.`);
	return { ref, lit, pair: result.pair };
}

/**
 * A measured value against a threshold, honest about its uncertainty: pass only when clearly on the right side,
 * fail only when clearly on the wrong side, and 'unknown' (a mentor decides) when too close to call.
 */
export function judge(value: number, uncertainty: number, test: { atLeast?: number; atMost?: number }): CriterionVerdict {
	const lo = value - uncertainty;
	const hi = value + uncertainty;
	const passes = (v: number) => (test.atLeast === undefined || v >= test.atLeast) && (test.atMost === undefined || v <= test.atMost);
	if (passes(lo) && passes(hi)) return 'pass';
	if (!passes(lo) && !passes(hi) && !(test.atLeast !== undefined && test.atMost !== undefined && lo < test.atLeast && hi > test.atMost)) return 'fail';
	return 'unknown';
}

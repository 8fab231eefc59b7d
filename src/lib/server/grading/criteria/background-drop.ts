// background-drop: the background's measured darkening from reference to lit frame must match the settings' EV change.
// A pass needs the pair itself to rule out a drop a tolerance away from the settings under every picture style the
// fit allows; where it cannot (see pair/comparametric.ts: a style and an exposure edit can trade exactly), the verdict
// is unknown and a mentor compares the frames, with what the files' Exif says about their provenance beside it
// (provenance.ts); that is never taken as proof of an unedited frame: an editor can keep every tag.
import { formatAmount, formatStops } from '../format';
import { frameWords, isResult, lookupFrame, requireExif, requirePair, type CriterionResult, type GradeContext } from '../result';
import { curveCanExplain, MIN_CURVE_SPAN, settingsDrop } from '../pair/index';
import { resolveFrames, type Criterion } from '../spec';
import { provenanceNote } from './provenance';

type BackgroundDrop = Extract<Criterion, { kind: 'background-drop' }>;

// More than this share of the reference background clipped (a blown sky) and its level cannot be known.
const MAX_CLIPPED_REFERENCE = 0.2;
// Background cells disagreeing this much (robust spread, stops) are not the same scene lit the same way.
const MAX_SPREAD = 0.5;
// below this settings change the curve cannot bend the drop by much
const MIN_D_FOR_CURVE = 0.3;
// A drop that agrees with the settings this closely is taken as it reads (an edit that a tone curve exactly undoes is
// too unlikely). Between this and the tolerance the pair cannot tell a camera's curve from an edited frame: a flat
// picture style can hide a frame darkened by a stop, a contrasty one can stretch a true drop past the tolerance.
// our estimate from the evaluation set (its noise is about 0.05 stop)
const AGREES = 0.15;
// With the camera's curve fitted (pair/comparametric.ts), the fitted drop this close to the settings passes.
// Either way, a pass needs the background to rule out a drop a tolerance away from the settings: with the drop held
// there, no picture style explains the cells within this factor of the best fit (a flat style can hide an edited frame).
// our choice from the evaluation set (seed 20261202), checked on a second set rendered from seed 777
const FIT_AGREES = 0.2;
const RULES_OUT = 2;

export function gradeBackgroundDrop(c: BackgroundDrop, ctx: GradeContext): CriterionResult {
	const { frame: litName, reference: refName } = resolveFrames(c, ctx.spec);
	const frames = refName ? [refName, litName] : [litName];
	const base = { kind: c.kind, target: null as number | null, tolerance: c.tolerance, unit: 'stops' as const, comparison: 'within' as const, frames };
	if (!refName) {
		return { ...base, verdict: 'unknown', measured: null, missing: [], message: 'This check compares a reference frame with the lit frame, and the Assignment lists only one frame.' };
	}
	const lit = lookupFrame(ctx, litName, base);
	if (isResult(lit)) return lit;
	const ref = lookupFrame(ctx, refName, base);
	if (isResult(ref)) return ref;
	const fields = ['exposureTime', 'fNumber', 'iso'] as const;
	const litExif = requireExif(lit, litName, fields, base);
	if (isResult(litExif)) return litExif;
	const refExif = requireExif(ref, refName, fields, base);
	if (isResult(refExif)) return refExif;

	// the pixels follow the settings actually used, so exposure compensation plays no part here
	const expected = settingsDrop(ref, lit) as number;
	const withTarget = { ...base, target: expected };
	const clipped = ref.pixels?.background.clippedShare ?? 0;
	if (clipped > MAX_CLIPPED_REFERENCE) {
		return {
			...withTarget,
			verdict: 'unknown',
			measured: null,
			missing: [],
			message: `${Math.round(clipped * 100)} % of the reference background is clipped (pure white, such as a blown sky), so how much it darkened cannot be measured; a mentor will compare the frames by eye.`
		};
	}
	const got = requirePair(ctx, refName, litName, withTarget, 'the background’s darkening');
	if (isResult(got)) return got;
	const { pair } = got;
	const plain = pair.backgroundDrop;
	const fit = pair.sceneDrop;
	const measured = fit?.drop ?? plain;
	const plainOff = Math.abs(plain - expected);
	const styleWords = fit && Math.abs(plain - fit.drop) >= 0.1 ? ` (${formatStops(plain)} read as plain sRGB: the camera’s picture style ${plain > fit.drop ? 'stretches' : 'squeezes'} the change)` : '';
	const found = `The background got ${formatStops(measured)} ${measured >= 0 ? 'darker' : 'brighter'} from ${frameWords(refName)} to ${frameWords(litName)}${styleWords}; its camera settings account for ${formatStops(expected)} ${expected >= 0 ? 'darker' : 'brighter'}.`;
	const provenance = provenanceNote(ref, lit, refName, litName);
	const unknown = (why: string): CriterionResult => ({ ...withTarget, verdict: 'unknown', measured, missing: [], message: `${found} ${why}${provenance}` });
	if (pair.backgroundSpread > MAX_SPREAD) {
		return unknown('Parts of the background changed by very different amounts (the scene or the framing moved between frames, or the flash reached the background), so a mentor will compare the frames by eye.');
	}
	const passes = { ...withTarget, verdict: 'pass' as const, measured, missing: [] };
	const editRuledOut =
		fit !== null && (fit.levelSpan < MIN_CURVE_SPAN || Math.min(fit.misfitAt(expected - c.tolerance), fit.misfitAt(expected + c.tolerance)) >= RULES_OUT);
	if (editRuledOut && plainOff <= Math.min(AGREES, c.tolerance)) {
		return { ...passes, message: `${found} They agree within ${formatAmount(c.tolerance)} stop, as they should for frames straight from the camera.` };
	}
	if (editRuledOut && fit && Math.abs(fit.drop - expected) <= Math.min(FIT_AGREES, c.tolerance) && plainOff <= c.tolerance) {
		return { ...passes, message: `${found} Read through the camera’s curve as fitted from the background, they agree within ${formatAmount(c.tolerance)} stop, as they should for frames straight from the camera.` };
	}
	if (plainOff <= c.tolerance) {
		return unknown(
			`That is within ${formatAmount(c.tolerance)} stop, but not so close that a camera’s tone curve (its picture style) can be ruled out: a curve can stretch or squeeze a change by this much, and it can also hide an edited frame, so the file alone cannot tell; a mentor will compare the frames by eye.`
		);
	}
	if (Math.abs(expected) >= MIN_D_FOR_CURVE && curveCanExplain(plain, expected)) {
		return unknown('A camera’s tone curve (its picture style) can stretch or squeeze a change in the JPEG by this much, so the file alone cannot tell; a mentor will compare the frames by eye.');
	}
	return {
		...withTarget,
		verdict: 'fail',
		measured,
		missing: [],
		message: `${found} These should agree within ${formatAmount(c.tolerance)} stop. Upload both frames straight from the camera (not edited), of the same scene a moment apart, and keep the flash off the background.${provenance}`
	};
}

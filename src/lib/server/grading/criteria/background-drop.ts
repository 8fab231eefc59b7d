// background-drop: the background's measured darkening from reference to lit frame must match the settings' EV change.
import { ev100 } from '../../../exposure/index';
import { formatAmount, formatStops } from '../format';
import { frameWords, isResult, lookupFrame, requireExif, requirePixels, type CriterionResult, type GradeContext } from '../result';
import { resolveFrames, type Criterion } from '../spec';

type BackgroundDrop = Extract<Criterion, { kind: 'background-drop' }>;

// A background this bright in the reference is at or near clipping: its darkening would read short.
// common practice, no published source
const NEAR_CLIPPING = 0.8;

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
	const expected = ev100({ aperture: litExif.fNumber, shutter: litExif.exposureTime, iso: litExif.iso }) -
		ev100({ aperture: refExif.fNumber, shutter: refExif.exposureTime, iso: refExif.iso });
	const withTarget = { ...base, target: expected };
	const litPixels = requirePixels(lit, litName, withTarget);
	if (isResult(litPixels)) return litPixels;
	const refPixels = requirePixels(ref, refName, withTarget);
	if (isResult(refPixels)) return refPixels;

	const measured = refPixels.background.stops - litPixels.background.stops;
	const found = `The background got ${formatStops(measured)} ${measured >= 0 ? 'darker' : 'brighter'} from ${frameWords(refName)} to ${frameWords(litName)}; its camera settings account for ${formatStops(expected)} ${expected >= 0 ? 'darker' : 'brighter'}.`;
	if (refPixels.background.luminance >= NEAR_CLIPPING) {
		return {
			...withTarget,
			verdict: 'unknown',
			measured,
			missing: [],
			message: `${found} The reference background is close to pure white, so its real brightness cannot be measured; a mentor will compare the frames by eye.`
		};
	}
	if (Math.abs(measured - expected) <= c.tolerance) {
		return { ...withTarget, verdict: 'pass', measured, missing: [], message: `${found} They agree within ${formatAmount(c.tolerance)} stop, as they should for frames straight from the camera.` };
	}
	return {
		...withTarget,
		verdict: 'fail',
		measured,
		missing: [],
		message: `${found} These should agree within ${formatAmount(c.tolerance)} stop. Upload both frames straight from the camera (not edited), of the same scene a moment apart, and keep the flash off the background.`
	};
}

// subject-lift: in the lit frame, how many stops brighter the subject stands than the background.
import { falloffStops } from '../../../exposure/index';
import { formatStopAmount, formatStops } from '../format';
import { isResult, lookupFrame, requirePixels, type CriterionResult, type GradeContext } from '../result';
import { resolveFrames, type Criterion } from '../spec';

type SubjectLift = Extract<Criterion, { kind: 'subject-lift' }>;

export function gradeSubjectLift(c: SubjectLift, ctx: GradeContext): CriterionResult {
	const { frame: name } = resolveFrames(c, ctx.spec);
	const base = { kind: c.kind, target: c.minStops, tolerance: null, unit: 'stops' as const, comparison: 'at-least' as const, frames: [name] };
	const frame = lookupFrame(ctx, name, base);
	if (isResult(frame)) return frame;
	const pixels = requirePixels(frame, name, base);
	if (isResult(pixels)) return pixels;

	const measured = pixels.subject.stops - pixels.background.stops;
	const relation = measured >= 0 ? `${formatStops(measured)} brighter than` : `${formatStops(measured)} darker than`;
	const found = `Your subject stands ${relation} the background; the assignment asks for at least ${formatStopAmount(c.minStops)} brighter.`;
	if (measured >= c.minStops) {
		return { ...base, verdict: 'pass', measured, missing: [], message: `${found} They stand out from the darker world around them.` };
	}
	// inverse-square: halving the flash distance gives this many stops more light on the subject
	const halfDistanceGain = falloffStops(1, 2);
	return {
		...base,
		verdict: 'fail',
		measured,
		missing: [],
		message: `${found} Put about ${formatStops(c.minStops - measured)} more flash on the subject: raise its power, or bring it closer (half the distance gives ${halfDistanceGain} stops more), or darken the ambient further with a faster shutter.`
	};
}

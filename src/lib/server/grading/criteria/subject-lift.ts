// subject-lift: how many stops the flash lifted the subject above the ambient alone, against the same subject in the reference.
import { formatStopAmount, formatStops } from '../format';
import { liftAdvice, syncSpeedOf } from '../messages';
import { curveDoubtNote, noLiftReason, shareFromLift, ratioFromLift } from '../pair/index';
import { isResult, judge, requirePair, type CriterionResult, type GradeContext } from '../result';
import { resolveFrames, type Criterion } from '../spec';
import { predictedLift, blownNote } from './evidence';

type SubjectLift = Extract<Criterion, { kind: 'subject-lift' }>;

export function gradeSubjectLift(c: SubjectLift, ctx: GradeContext): CriterionResult {
	const { frame: litName, reference: refName } = resolveFrames(c, ctx.spec);
	const base = { kind: c.kind, target: c.minStops, tolerance: null, unit: 'stops' as const, comparison: 'at-least' as const, frames: refName ? [refName, litName] : [litName] };
	const got = requirePair(ctx, refName, litName, base, 'the flash’s lift on the subject');
	if (isResult(got)) return got;
	const { pair, lit } = got;
	if (pair.lift === null) {
		return { ...base, verdict: 'unknown', measured: null, missing: [], message: `${noLiftReason(pair)} A mentor will judge the lift by eye.` };
	}
	const lift = pair.lift;
	const evidence = {
		lift,
		flashShare: shareFromLift(lift),
		ratioStops: Number.isFinite(ratioFromLift(lift)) ? ratioFromLift(lift) : undefined,
		uncertainty: pair.liftUncertainty,
		predictedLift: predictedLift(ctx, got.ref, lit, lift) ?? undefined,
		blownPercent: 100 * pair.blownShare,
		lowerBound: pair.liftIsLowerBound || undefined
	};
	const judged = judge(lift, pair.liftUncertainty, { atLeast: c.minStops });
	// most of the subject blown out: the lift is a lower bound, which can prove a pass but never a fail
	const verdict = judged === 'fail' && pair.liftIsLowerBound ? 'unknown' : judged;
	const found = `The flash lifted your subject ${formatStops(lift)} above the ambient light alone (measured against the same subject in the reference frame, so skin and clothing tones do not count); the assignment asks for at least ${formatStopAmount(c.minStops)}.`;
	const note = blownNote(pair.blownShare);
	if (verdict === 'pass') return { ...base, verdict, measured: lift, missing: [], evidence, message: `${found} They stand out from the darker world around them.${note}` };
	if (verdict === 'unknown') {
		return { ...base, verdict, measured: lift, missing: [], evidence, message: `${found} That is within the measuring uncertainty (± ${formatStops(pair.liftUncertainty)}) of the target, so a mentor will decide.${curveDoubtNote(pair)}${note}` };
	}
	const advice = liftAdvice({ exposureTime: lit.exif.exposureTime, lift, wanted: c.minStops }, syncSpeedOf(ctx.spec));
	return { ...base, verdict, measured: lift, missing: [], evidence, message: `${found} ${advice}${note}` };
}

// flash-evidence: the flash measured from the pixels (what it added to the subject), with the Exif Flash bit as a footnote.
import { describeFlash } from '../../analysis/index';
import { formatStopAmount, formatStops } from '../format';
import { frameWords, isResult, judge, lookupFrame, requirePair, type CriterionResult, type GradeContext } from '../result';
import { noLiftReason, shareFromLift } from '../pair/index';
import { resolveFrames, type Criterion } from '../spec';

type FlashEvidence = Extract<Criterion, { kind: 'flash-evidence' }>;

export function gradeFlashEvidence(c: FlashEvidence, ctx: GradeContext): CriterionResult {
	const { frame: litName, reference: refName } = resolveFrames(c, ctx.spec);
	const base = { kind: c.kind, target: c.minLiftStops, tolerance: null, unit: 'stops' as const, comparison: 'at-least' as const, frames: refName ? [refName, litName] : [litName] };
	const lit = lookupFrame(ctx, litName, base);
	if (isResult(lit)) return lit;
	const flash = lit.exif.flash;
	const bit = flash
		? flash.fired
			? `The camera recorded the flash (${describeFlash(flash)}).`
			: 'The camera did not record a flash firing; many radio triggers leave that unmarked, so the pixels decide.'
		: 'The file has no Flash tag in its Exif, so the pixels decide.';
	const missing = flash ? [] : ['Flash'];

	const got = requirePair(ctx, refName, litName, base, 'the flash');
	if (isResult(got)) return { ...got, missing, message: `${bit} ${got.message}` };
	const lift = got.pair.lift;
	if (lift === null) {
		return { ...base, verdict: 'unknown', measured: null, missing, message: `${bit} ${noLiftReason(got.pair)} A mentor will confirm the flash.` };
	}
	const u = got.pair.liftUncertainty;
	const evidence = { lift, flashShare: shareFromLift(lift), uncertainty: u, blownPercent: 100 * got.pair.blownShare, lowerBound: got.pair.liftIsLowerBound || undefined };
	const judged = judge(lift, u, { atLeast: c.minLiftStops });
	// most of the subject blown out: the lift is a lower bound, which can prove a pass but never a fail
	const verdict = judged === 'fail' && got.pair.liftIsLowerBound ? 'unknown' : judged;
	const measuredWords = `Measured from the pixels: the subject in ${frameWords(litName)} is ${formatStops(lift)} brighter than the ambient alone would make it (against ${frameWords(refName as string)}).`;
	if (verdict === 'pass') return { ...base, verdict, measured: lift, missing: [], evidence, message: `${measuredWords} That is your flash at work (a reflector could do the same). ${bit}` };
	if (verdict === 'unknown') {
		return { ...base, verdict, measured: lift, missing, evidence, message: `${measuredWords} That is too close to the ${formatStopAmount(c.minLiftStops)} a flash usually adds to call, so a mentor will confirm it. ${bit}` };
	}
	const fired = flash?.fired ? ' The camera says a flash fired, but it did not reach the subject: check the trigger channel, the flash’s direction and its distance.' : '';
	return {
		...base,
		verdict,
		measured: lift,
		missing: [],
		evidence,
		message: `${measuredWords} That is less than the ${formatStopAmount(c.minLiftStops)} a flash adds, so no flash light reached the subject.${fired}`
	};
}

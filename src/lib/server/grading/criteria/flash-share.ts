// flash-share: the flash's share of the subject's light (or the flash:ambient ratio), measured from the reference/lit pair.
import { mix } from '../../../exposure/index';
import { formatAmount, formatStops } from '../format';
import { curveDoubtNote, noLiftReason, ratioFromLift, shareFromLift } from '../pair/index';
import { isResult, judge, requirePair, type CriterionResult, type GradeContext } from '../result';
import { resolveFrames, type Criterion } from '../spec';

type FlashShare = Extract<Criterion, { kind: 'flash-share' }>;

const percent = (share: number) => `${Math.round(share * 100)} %`;

/** Target flash:ambient ratio in stops: given directly, or from a share s as log2(s / (1 − s)). */
export function targetRatio(c: FlashShare): number {
	if (c.ratioStops !== undefined) return c.ratioStops;
	const s = c.share as number;
	return Math.log2(s / (1 - s));
}

export function gradeFlashShare(c: FlashShare, ctx: GradeContext): CriterionResult {
	const { frame: litName, reference: refName } = resolveFrames(c, ctx.spec);
	const target = targetRatio(c);
	const base = { kind: c.kind, target, tolerance: c.tolerance, unit: 'stops' as const, comparison: 'within' as const, frames: refName ? [refName, litName] : [litName] };
	const got = requirePair(ctx, refName, litName, base, 'the flash’s share of the subject’s light');
	if (isResult(got)) return got;
	const lift = got.pair.lift;
	if (lift === null) {
		return { ...base, verdict: 'unknown', measured: null, missing: [], message: `${noLiftReason(got.pair)} A mentor will judge the balance by eye.` };
	}
	// judged on the lift, where the measuring uncertainty is even: a ratio r gives a lift of mix(0, r)
	const lo = mix({ ambientStops: 0, flashStops: target - c.tolerance });
	const hi = mix({ ambientStops: 0, flashStops: target + c.tolerance });
	// most of the subject blown out: the lift is only a lower bound, which can prove too much flash but nothing else
	const u = got.pair.liftUncertainty;
	const verdict = got.pair.liftIsLowerBound ? (lift - u > hi ? 'fail' : 'unknown') : judge(lift, u, { atLeast: lo, atMost: hi });
	const ratio = ratioFromLift(lift);
	const share = shareFromLift(lift);
	const measured = Number.isFinite(ratio) ? ratio : null;
	const evidence = { lift, flashShare: share, ratioStops: measured ?? undefined, uncertainty: u, lowerBound: got.pair.liftIsLowerBound || undefined };
	const wanted = c.share !== undefined ? `about ${percent(c.share)} from the flash` : `flash ${formatAmount(target)} stops over the ambient`;
	const lowerBound = got.pair.liftIsLowerBound;
	const found = `The flash gave ${lowerBound ? 'at least ' : ''}${percent(share)} of the light on your subject (flash ${measured === null ? 'nothing' : `${measured >= 0 ? '' : '−'}${formatStops(measured)} ${measured >= 0 ? 'over' : 'under'} the ambient`}); the assignment asks for ${wanted}, ± ${formatAmount(c.tolerance)} stop.`;
	if (verdict === 'pass') return { ...base, verdict, measured, missing: [], evidence, message: `${found} A good balance of your two lights.` };
	if (verdict === 'unknown') {
		const why = lowerBound
			? 'Most of the flash-lit subject is blown out (pure white), so that is only a lower bound and the balance cannot be measured; a mentor will decide.'
			: `That is too close to the edge of the range to call (± ${formatStops(u)} on the subject’s level), so a mentor will decide.${curveDoubtNote(got.pair)}`;
		return { ...base, verdict, measured, missing: [], evidence, message: `${found} ${why}` };
	}
	const more = lift < lo;
	const change = measured === null ? null : Math.abs(target - measured);
	return {
		...base,
		verdict,
		measured,
		missing: [],
		evidence,
		message: `${found} ${more ? 'Give the flash more' : 'Give the flash less'} power${change !== null ? ` (about ${formatStops(change)})` : ''}, or move it ${more ? 'closer' : 'back'}; a change of shutter speed within sync moves only the ambient.`
	};
}

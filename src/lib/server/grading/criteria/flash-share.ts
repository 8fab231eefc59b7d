// flash-share: the flash's share of the subject's light (or the flash:ambient ratio), measured from the reference/lit pair.
//
// The ratio is read from the lift (ratioFromLift) with the lift's uncertainty carried through (ratioRange). Where
// that range is wider than ± the criterion's tolerance (a weak flash, where the ratio is steep in the lift, or a tone
// curve the pair cannot tell from an edit) the result states what the pair can vouch for instead of a number: an
// upper bound when the flash is too weak whatever the true value, a lower bound when it is too strong, and the range
// with 'unknown' when it straddles the asked window. The verdict is the range against the window. A decided verdict
// whose range is wide only through the tone curve's doubt still states the measured number (see `measuring`).
import { formatAmount, formatStops } from '../format';
import { curveDoubtNote, noLiftReason, ratioRange, shareFromLift } from '../pair/index';
import { isResult, requirePair, type CriterionResult, type CriterionVerdict, type GradeContext } from '../result';
import { resolveFrames, type Criterion } from '../spec';

type FlashShare = Extract<Criterion, { kind: 'flash-share' }>;

const percent = (share: number) => `${Math.round(share * 100)} %`;
/** Share of the subject's light from the flash for a flash:ambient ratio in stops. */
const shareOfRatio = (r: number) => (r === -Infinity ? 0 : r === Infinity ? 1 : 1 / (1 + 2 ** -r));
const ratioWords = (r: number) => `${formatStops(r)} ${r >= 0 ? 'over' : 'under'} the ambient`;
const finite = (r: number) => (Number.isFinite(r) ? r : null);

/** Target flash:ambient ratio in stops: given directly, or from a share s as log2(s / (1 − s)). */
export function targetRatio(c: FlashShare): number {
	if (c.ratioStops !== undefined) return c.ratioStops;
	const s = c.share as number;
	return Math.log2(s / (1 - s));
}

/** pass when the whole range lies in the window, fail when none of it does, otherwise a mentor decides. */
export function judgeRange(low: number, high: number, window: { low: number; high: number }): CriterionVerdict {
	if (high < window.low || low > window.high) return 'fail';
	return low >= window.low && high <= window.high ? 'pass' : 'unknown';
}

export function gradeFlashShare(c: FlashShare, ctx: GradeContext): CriterionResult {
	const { frame: litName, reference: refName } = resolveFrames(c, ctx.spec);
	const target = targetRatio(c);
	const base = { kind: c.kind, target, tolerance: c.tolerance, unit: 'stops' as const, comparison: 'within' as const, frames: refName ? [refName, litName] : [litName] };
	const got = requirePair(ctx, refName, litName, base, 'the flash’s share of the subject’s light');
	if (isResult(got)) return got;
	const { pair } = got;
	const range = ratioRange(pair);
	if (pair.lift === null || range === null) {
		return { ...base, verdict: 'unknown', measured: null, missing: [], message: `${noLiftReason(pair)} A mentor will judge the balance by eye.` };
	}
	const lift = pair.lift;
	const u = pair.liftUncertainty;
	const window = { low: target - c.tolerance, high: target + c.tolerance };
	const verdict = judgeRange(range.low, range.high, window);
	const wanted = c.share !== undefined ? `about ${percent(c.share)} from the flash` : `flash ${formatAmount(target)} stops over the ambient`;
	const asks = `the assignment asks for ${wanted}, ± ${formatAmount(c.tolerance)} stop`;
	const advice = (more: boolean, change: string) =>
		`${more ? 'Give the flash more' : 'Give the flash less'} power (${change}), or move it ${more ? 'closer' : 'back'}; a change of shutter speed within sync moves only the ambient.`;

	// most of the subject blown out: the lift is only a lower bound, which can prove too much flash but nothing else
	// (the least ratio is the range's low end: the lift's least value less its uncertainty)
	if (pair.liftIsLowerBound) {
		const ratio = finite(range.low);
		const evidence = { lift: lift - u, flashShare: shareOfRatio(range.low), ratioStops: ratio ?? undefined, lowerBound: true };
		const found = `The flash gave at least ${percent(shareOfRatio(range.low))} of the light on your subject${ratio === null ? '' : ` (flash ${range.low >= 0 ? 'at least' : 'at most'} ${ratioWords(ratio)})`}; ${asks}.`;
		if (verdict === 'fail') return { ...base, verdict, measured: ratio, missing: [], evidence, message: `${found} ${advice(false, `at least ${formatStops(range.low - target)}`)}` };
		return {
			...base,
			verdict: 'unknown',
			measured: ratio,
			missing: [],
			evidence,
			message: `${found} Most of the flash-lit subject is blown out (pure white), so that is only a lower bound and the balance cannot be measured; a mentor will decide.`
		};
	}

	const ratio = Math.log2(2 ** lift - 1);
	// A number is stated when it is known within ± the tolerance. A decided verdict asks that of the measurement alone:
	// the tone curve's doubt
	// (an edit the pair cannot rule out) already went into the verdict through the full range. An undecided one states
	// a number only when even the full range is that narrow; otherwise the range is what the pair knows.
	const measuring = verdict === 'unknown' ? range : (ratioRange(pair, u - pair.curveDoubt) ?? range);
	const narrow = measuring.high - measuring.low <= 2 * c.tolerance || verdict === 'pass';
	if (narrow && Number.isFinite(ratio)) {
		const evidence = { lift, flashShare: shareFromLift(lift), ratioStops: ratio, uncertainty: u };
		const found = `The flash gave ${percent(shareFromLift(lift))} of the light on your subject (flash ${ratioWords(ratio)}); ${asks}.`;
		if (verdict === 'pass') return { ...base, verdict, measured: ratio, missing: [], evidence, message: `${found} A good balance of your two lights.` };
		if (verdict === 'unknown') {
			return {
				...base,
				verdict,
				measured: ratio,
				missing: [],
				evidence,
				message: `${found} That is too close to the edge of the range to call (± ${formatStops(u)} on the subject’s level), so a mentor will decide.${curveDoubtNote(pair)}`
			};
		}
		return { ...base, verdict, measured: ratio, missing: [], evidence, message: `${found} ${advice(ratio < target, `about ${formatStops(target - ratio)}`)}` };
	}
	// too little flash whatever the true value: the most it can have been
	if (verdict === 'fail' && range.high < window.low) {
		const evidence = { lift: lift + u, flashShare: shareOfRatio(range.high), ratioStops: range.high, upperBound: true };
		const found = `The flash gave at most ${percent(shareOfRatio(range.high))} of the light on your subject (flash ${range.high >= 0 ? 'at most' : 'at least'} ${ratioWords(range.high)}); ${asks}. The pair cannot narrow it further (± ${formatStops(u)} on the subject’s level), but that is too little either way.`;
		return { ...base, verdict, measured: range.high, missing: [], evidence, message: `${found} ${advice(true, `at least ${formatStops(window.low - range.high)}`)}` };
	}
	// too much flash whatever the true value: the least it can have been
	if (verdict === 'fail' && range.low > window.high) {
		const evidence = { lift: lift - u, flashShare: shareOfRatio(range.low), ratioStops: range.low, lowerBound: true };
		const found = `The flash gave at least ${percent(shareOfRatio(range.low))} of the light on your subject (flash ${range.low >= 0 ? 'at least' : 'at most'} ${ratioWords(range.low)}); ${asks}. The pair cannot narrow it further (± ${formatStops(u)} on the subject’s level), but that is too much either way.`;
		return { ...base, verdict, measured: range.low, missing: [], evidence, message: `${found} ${advice(false, `at least ${formatStops(range.low - window.high)}`)}` };
	}
	// the range straddles the window: no number is stated, the range is
	const evidence = { lift, flashShare: shareFromLift(lift), uncertainty: u, ratioRange: [finite(range.low), finite(range.high)] as [number | null, number | null] };
	const between =
		range.low === -Infinity
			? `at most ${percent(shareOfRatio(range.high))} of the light on your subject (flash ${range.high >= 0 ? 'at most' : 'at least'} ${ratioWords(range.high)})`
			: `between ${percent(shareOfRatio(range.low))} and ${percent(shareOfRatio(range.high))} of the light on your subject (flash from ${ratioWords(range.low)} to ${ratioWords(range.high)})`;
	return {
		...base,
		verdict: 'unknown',
		measured: null,
		missing: [],
		evidence,
		message: `The flash gave ${between}; ${asks}. The pair cannot narrow it to the tolerance (± ${formatStops(u)} on the subject’s level), so a mentor will decide.${curveDoubtNote(pair)}`
	};
}

// mentor-judged: what only a person can see in the picture (the shape of light on a face); handed to a mentor with what to look for.
import { sentence } from '../format';
import { isResult, lookupFrame, type CriterionResult, type GradeContext } from '../result';
import { resolveFrames, type Criterion } from '../spec';

type MentorJudged = Extract<Criterion, { kind: 'mentor-judged' }>;

export function gradeMentorJudged(c: MentorJudged, ctx: GradeContext): CriterionResult {
	const { frame: name } = resolveFrames(c, ctx.spec);
	const base = { kind: c.kind, target: null, tolerance: null, unit: 'judged' as const, comparison: 'within' as const, frames: [name] };
	const frame = lookupFrame(ctx, name, base);
	if (isResult(frame)) return frame;
	const plan = ctx.spec.lightPlan ? ' and the Light Plan you attached' : '';
	// 'unknown': the mentor's call, not a failure of the file (the Attempt goes to review unless another criterion failed)
	return { ...base, verdict: 'unknown', measured: null, missing: [], message: `A mentor judges this from the picture${plan}: ${sentence(c.look)}` };
}

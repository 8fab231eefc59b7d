// subject-clipping: at most a given share of the flash-lit subject blown out (clipped to white).
import { isResult, lookupFrame, requirePair, requirePixels, judge, type CriterionResult, type GradeContext } from '../result';
import { resolveFrames, type Criterion } from '../spec';

type SubjectClipping = Extract<Criterion, { kind: 'subject-clipping' }>;

// a clipped sky in the box would read as a blown subject without a reference frame to tell them apart
const MAX_BACKGROUND_CLIPPED = 0.05;

export function gradeSubjectClipping(c: SubjectClipping, ctx: GradeContext): CriterionResult {
	const { frame: litName, reference: refName } = resolveFrames(c, ctx.spec);
	const base = { kind: c.kind, target: c.maxPercent, tolerance: null, unit: 'percent' as const, comparison: 'at-most' as const, frames: refName ? [refName, litName] : [litName] };
	const advice = 'Turn the flash down, move it back, or close the aperture a little.';
	if (refName !== null) {
		const got = requirePair(ctx, refName, litName, base, 'the blown part of the subject');
		if (isResult(got)) return got;
		const measured = 100 * got.pair.blownShare;
		const found = `About ${Math.round(measured)} % of the flash-lit subject is blown out (clipped to white, where no detail is left); the assignment allows up to ${c.maxPercent} %.`;
		const verdict = judge(measured, 3, { atMost: c.maxPercent });
		const tail = verdict === 'pass' ? ' The highlights keep their detail.' : verdict === 'fail' ? ` ${advice}` : ' That is too close to call, so a mentor will decide.';
		return { ...base, verdict, measured, missing: [], evidence: { blownPercent: measured }, message: `${found}${tail}` };
	}
	const lit = lookupFrame(ctx, litName, base);
	if (isResult(lit)) return lit;
	const pixels = requirePixels(lit, litName, base);
	if (isResult(pixels)) return pixels;
	const measured = 100 * pixels.subject.clippedShare;
	const found = `About ${Math.round(measured)} % of the subject box is clipped to white; the assignment allows up to ${c.maxPercent} % of the subject.`;
	if (measured <= c.maxPercent) return { ...base, verdict: 'pass', measured, missing: [], message: `${found} The highlights keep their detail.` };
	if (pixels.background.clippedShare > MAX_BACKGROUND_CLIPPED) {
		return { ...base, verdict: 'unknown', measured, missing: [], message: `${found} Part of the background is clipped too (a bright sky), and without an ambient reference frame the two cannot be told apart, so a mentor will judge it.` };
	}
	return { ...base, verdict: 'fail', measured, missing: [], message: `${found} ${advice}` };
}

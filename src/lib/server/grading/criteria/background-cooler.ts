// background-cooler: how many mireds cooler (bluer) the background's light renders than the light on the subject.
//
// With a reference frame, the colour of the light is judged against what changed: per colour channel, the lift the
// flash gave the subject over the ambient alone (same surface in both frames, so skin and clothing colours cancel).
// That is the gel's work, whatever the white balance. Without one, the background must render bluer than neutral and
// than the subject (the low-Kelvin white balance's work), with the Exif WhiteBalance mode as supporting evidence.
import { mired } from '../../../exposure/index';
import { formatKelvin, formatMired, formatStops } from '../format';
import { miredOf } from '../pair/index';
import { isResult, judge, lookupFrame, requirePair, requirePixels, type CriterionResult, type GradeContext, type ResultBase } from '../result';
import { resolveFrames, type Criterion } from '../spec';

type BackgroundCooler = Extract<Criterion, { kind: 'background-cooler' }>;

// ± mireds a measured shift may be off by (JPEG chroma, the tone curve per channel). our estimate from the evaluation set
const UNCERTAINTY = 15;
// the flash must carry this share of the subject's light for its colour to be measured
const MIN_SHARE_LIFT = 0.5;
// the sRGB white point (D65) as nearest Planckian point, in mireds: "neutral"
const NEUTRAL = miredOf([1, 1, 1]) as number;

function fix(c: BackgroundCooler, measured: number, auto: boolean): string {
	return `Set a lower Kelvin white balance (around 3200 K) and put a CTO gel on the flash so it matches: about ${formatMired(Math.max(0, c.minMired - measured))} more is needed.${auto ? ' The camera was on auto white balance, which pulls the blue back to grey: set a Kelvin value instead.' : ''}`;
}

function withoutReference(c: BackgroundCooler, ctx: GradeContext, name: string, base: ResultBase): CriterionResult {
	const frame = lookupFrame(ctx, name, base);
	if (isResult(frame)) return frame;
	const pixels = requirePixels(frame, name, base);
	if (isResult(pixels)) return pixels;
	const subjectK = pixels.subject.cct;
	const backgroundK = pixels.background.cct;
	if (subjectK === null || backgroundK === null) {
		const region = subjectK === null ? pixels.subject : pixels.background;
		const which = subjectK === null ? 'subject' : 'background';
		const why = region.duv === null ? 'is too dark, or too strongly coloured, to have a colour temperature' : 'is too far from the colour of any white light to have a colour temperature';
		return { ...base, verdict: 'unknown', measured: null, missing: [], message: `The ${which} ${why}; a mentor will judge the colour by eye.` };
	}
	// cooler means fewer mireds; the background must be cooler than neutral grey and than the subject
	const measured = Math.min(NEUTRAL, mired(subjectK)) - mired(backgroundK);
	const auto = frame.exif.whiteBalance === 'auto';
	const found = `Your background renders at about ${formatKelvin(backgroundK)} and your subject at about ${formatKelvin(subjectK)}: the background is ${formatMired(measured)} ${measured >= 0 ? 'cooler' : 'warmer'} than ${mired(subjectK) < NEUTRAL ? 'the subject' : 'neutral grey'}; the assignment asks for at least ${formatMired(c.minMired)}. With no ambient reference frame, a blue wall cannot be told from a blue rendering.`;
	const verdict = judge(measured, UNCERTAINTY, { atLeast: c.minMired });
	if (verdict === 'fail') return { ...base, verdict, measured, missing: [], message: `${found} ${fix(c, measured, auto)}` };
	if (verdict === 'pass' && !auto) return { ...base, verdict, measured, missing: [], message: `${found} The daylight reads blue while your subject stays natural.` };
	const why = auto ? 'The camera was on auto white balance, so the blue may be the background’s own colour' : 'That is too close to the target to call';
	return { ...base, verdict: 'unknown', measured, missing: [], message: `${found} ${why}; a mentor will judge it by eye.` };
}

export function gradeBackgroundCooler(c: BackgroundCooler, ctx: GradeContext): CriterionResult {
	const { frame: litName, reference: refName } = resolveFrames(c, ctx.spec);
	const base = { kind: c.kind, target: c.minMired, tolerance: null, unit: 'mired' as const, comparison: 'at-least' as const, frames: refName ? [refName, litName] : [litName] };
	if (refName === null) return withoutReference(c, ctx, litName, base);
	const got = requirePair(ctx, refName, litName, base, 'the colour of the flash against the daylight');
	if (isResult(got)) return got;
	const { pair, lit } = got;
	const auto = lit.exif.whiteBalance === 'auto';
	if (pair.lift !== null && pair.lift < MIN_SHARE_LIFT - pair.liftUncertainty) {
		return {
			...base,
			verdict: 'fail',
			measured: 0,
			missing: [],
			message: `The flash added only ${formatStops(pair.lift)} to the subject, so the light on the subject is the same daylight as on the background: no colour contrast between them. ${fix(c, 0, auto)}`
		};
	}
	if (pair.warmerMired === null) {
		return { ...base, verdict: 'unknown', measured: null, missing: [], message: 'The colour of the flash on the subject could not be measured against the daylight (too little flash, or a colour far from any white light), so a mentor will judge it by eye.' };
	}
	const measured = pair.warmerMired;
	const found = `The light on your subject renders ${formatMired(measured)} ${measured >= 0 ? 'warmer' : 'cooler'} than the daylight on the background (measured on the subject against the reference frame, so skin and clothing colours do not count); the assignment asks for the background at least ${formatMired(c.minMired)} cooler.`;
	const verdict = judge(measured, UNCERTAINTY, { atLeast: c.minMired });
	if (verdict === 'pass') return { ...base, verdict, measured, missing: [], message: `${found} The daylight reads blue while your gelled flash keeps the skin natural.` };
	if (verdict === 'unknown') return { ...base, verdict, measured, missing: [], message: `${found} That is too close to the target to call, so a mentor will decide.` };
	return { ...base, verdict, measured, missing: [], message: `${found} ${fix(c, measured, auto)}` };
}

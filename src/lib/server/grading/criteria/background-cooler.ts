// background-cooler: how many mireds cooler (bluer) the background renders than the subject in the lit frame.
import { mired } from '../../../exposure/index';
import { formatKelvin, formatMired } from '../format';
import { isResult, lookupFrame, requirePixels, type CriterionResult, type GradeContext } from '../result';
import { resolveFrames, type Criterion } from '../spec';

type BackgroundCooler = Extract<Criterion, { kind: 'background-cooler' }>;

// McCamy's formula (1992) is fitted for about 2000–8000 K (REFERENCES.md notes it weakens above ~8000 K)
const MCCAMY_UPPER = 8000;

export function gradeBackgroundCooler(c: BackgroundCooler, ctx: GradeContext): CriterionResult {
	const { frame: name } = resolveFrames(c, ctx.spec);
	const base = { kind: c.kind, target: c.minMired, tolerance: null, unit: 'mired' as const, comparison: 'at-least' as const, frames: [name] };
	const frame = lookupFrame(ctx, name, base);
	if (isResult(frame)) return frame;
	const pixels = requirePixels(frame, name, base);
	if (isResult(pixels)) return pixels;

	const subjectK = pixels.subject.cct;
	const backgroundK = pixels.background.cct;
	if (subjectK === null || backgroundK === null) {
		const region = subjectK === null ? pixels.subject : pixels.background;
		const which = subjectK === null ? 'subject' : 'background';
		const why = region.duv === null ? 'is too dark to read its colour reliably' : 'is too strongly coloured to have a colour temperature (it is far from the colour of any white light)';
		return { ...base, verdict: 'unknown', measured: null, missing: [], message: `The ${which} ${why}; a mentor will judge the colour by eye.` };
	}
	// cooler means a higher colour temperature, i.e. fewer mireds
	const measured = mired(subjectK) - mired(backgroundK);
	const approx = backgroundK > MCCAMY_UPPER ? ' (approximate: very blue colours sit beyond the formula’s best range)' : '';
	const found = `Your background renders at about ${formatKelvin(backgroundK)}${approx} and your subject at about ${formatKelvin(subjectK)}: the background is ${formatMired(measured)} ${measured >= 0 ? 'cooler' : 'warmer'}; the assignment asks for at least ${formatMired(c.minMired)} cooler.`;
	if (measured >= c.minMired) return { ...base, verdict: 'pass', measured, missing: [], message: `${found} The daylight reads blue while your gelled flash keeps the skin natural.` };
	const auto = frame.exif.whiteBalance === 'auto' ? ' The camera was on auto white balance, which pulls the blue back to grey: set a Kelvin value instead.' : '';
	return {
		...base,
		verdict: 'fail',
		measured,
		missing: [],
		message: `${found} Set a lower Kelvin white balance (around 3200 K) and put a CTO gel on the flash so it matches: about ${formatMired(c.minMired - measured)} more is needed.${auto}`
	};
}

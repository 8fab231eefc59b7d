// flash-evidence: the Exif Flash bit, else pixel evidence handed to a mentor (radio triggers often leave the bit unset).
import { describeFlash, type Frame } from '../../analysis/index';
import { formatStopAmount, formatStops } from '../format';
import { frameWords, isResult, lookupFrame, type CriterionResult, type GradeContext } from '../result';
import { resolveFrames, type Criterion } from '../spec';

type FlashEvidence = Extract<Criterion, { kind: 'flash-evidence' }>;

/** Subject-over-background in the lit frame minus the same in the ambient reference, in stops (null if unmeasured). */
function liftBeyondAmbient(lit: Frame, ref: Frame | undefined): number | null {
	if (!lit.pixels) return null;
	const litLift = lit.pixels.subject.stops - lit.pixels.background.stops;
	if (!ref?.pixels) return litLift;
	return litLift - (ref.pixels.subject.stops - ref.pixels.background.stops);
}

export function gradeFlashEvidence(c: FlashEvidence, ctx: GradeContext): CriterionResult {
	const { frame: litName, reference: refName } = resolveFrames(c, ctx.spec);
	const base = {
		kind: c.kind,
		target: c.minLiftStops,
		tolerance: null,
		unit: 'stops' as const,
		comparison: 'at-least' as const,
		frames: refName ? [refName, litName] : [litName]
	};
	const lit = lookupFrame(ctx, litName, base);
	if (isResult(lit)) return lit;
	const ref = refName ? ctx.frames[refName] : undefined;
	const lift = liftBeyondAmbient(lit, ref);

	if (lit.exif.flash?.fired) {
		return { ...base, verdict: 'pass', measured: lift, missing: [], message: `The camera recorded the flash in ${frameWords(litName)} (${describeFlash(lit.exif.flash)}).` };
	}

	const bit = lit.exif.flash
		? 'The camera did not record a flash firing; many radio triggers leave that setting unmarked.'
		: 'The file has no Flash tag in its Exif, so it cannot say whether a flash fired.';
	const basis = ref?.pixels ? `than in ${frameWords(refName as string)}` : 'than the background';
	let pixels: string;
	if (lift === null) pixels = 'Its pixels were not measured either.';
	else if (lift >= c.minLiftStops) {
		pixels = `The subject is ${formatStops(lift)} brighter ${ref?.pixels ? 'against the background ' : ''}${basis}, which points to flash (a reflector can do the same).`;
	} else {
		pixels = `The subject gains only ${formatStops(lift)} ${ref?.pixels ? 'against the background ' : ''}${basis}, less than the ${formatStopAmount(c.minLiftStops)} flash usually adds.`;
	}
	return {
		...base,
		verdict: 'unknown',
		measured: lift,
		missing: lit.exif.flash ? [] : ['Flash'],
		message: `${bit} ${pixels} A mentor will confirm the flash, so this is not counted against you.`
	};
}

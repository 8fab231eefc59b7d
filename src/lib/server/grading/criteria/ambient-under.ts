// ambient-under: how far the lit frame's settings sit under the metered ambient (reference frame or a given scene EV).
import { ev100, meteredEv } from '../../../exposure/index';
import { formatDecimal, formatStops, formatTarget } from '../format';
import { adviseExposure } from '../messages';
import { frameWords, isResult, lookupFrame, requireExif, type CriterionResult, type GradeContext } from '../result';
import { resolveFrames, type Criterion } from '../spec';

type AmbientUnder = Extract<Criterion, { kind: 'ambient-under' }>;

export function gradeAmbientUnder(c: AmbientUnder, ctx: GradeContext): CriterionResult {
	const { frame: litName, reference: refName } = resolveFrames(c, ctx.spec);
	const sceneEv = c.sceneEv ?? ctx.spec.sceneEv;
	const base = {
		kind: c.kind,
		target: c.stops,
		tolerance: c.tolerance,
		unit: 'stops' as const,
		comparison: 'within' as const,
		frames: refName === null ? [litName] : [refName, litName]
	};

	const lit = lookupFrame(ctx, litName, base);
	if (isResult(lit)) return lit;
	const litExif = requireExif(lit, litName, ['exposureTime', 'fNumber', 'iso'], base);
	if (isResult(litExif)) return litExif;
	const litEv = ev100({ aperture: litExif.fNumber, shutter: litExif.exposureTime, iso: litExif.iso });

	let ambientEv: number;
	let against: string;
	if (refName === null) {
		// the schema guarantees a scene EV when there is no reference frame
		ambientEv = sceneEv ?? 0;
		against = `the scene’s ambient reading (EV ${formatDecimal(ambientEv)} at ISO 100)`;
	} else {
		const ref = lookupFrame(ctx, refName, base);
		if (isResult(ref)) return ref;
		const refExif = requireExif(ref, refName, ['exposureTime', 'fNumber', 'iso', 'exposureBias'], base);
		if (isResult(refExif)) return refExif;
		// a reference shot with +1 bias was given a stop more than the meter asked: undo it
		ambientEv = meteredEv({ aperture: refExif.fNumber, shutter: refExif.exposureTime, iso: refExif.iso, exposureBias: refExif.exposureBias });
		against = refExif.exposureBias === 0 ? `${frameWords(refName)}` : `the metered ambient of ${frameWords(refName)} (its exposure compensation taken out)`;
	}

	const measured = litEv - ambientEv;
	const ok = Math.abs(measured - c.stops) <= c.tolerance;
	const where = measured >= 0 ? `${formatStops(measured)} under` : `${formatStops(measured)} over`;
	const found = `Your ambient exposure (what sets the background) sits ${where} ${against}; the assignment asks for ${formatTarget(c.stops, c.tolerance)} under.`;
	if (ok) return { ...base, verdict: 'pass', measured, missing: [], message: `${found} Well judged: the background will go deep while your flash carries the subject.` };

	const advice = adviseExposure({ exposureTime: litExif.exposureTime, fNumber: litExif.fNumber, iso: litExif.iso }, ambientEv + c.stops);
	const direction = measured < c.stops ? 'darker' : 'brighter';
	return {
		...base,
		verdict: 'fail',
		measured,
		missing: [],
		message: `${found} Make the ambient ${formatStops(c.stops - measured)} ${direction}. ${advice ?? ''}`.trim()
	};
}

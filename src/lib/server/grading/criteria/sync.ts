// sync: the shutter within the camera's flash sync speed, unless the assignment allows high-speed sync (whose cost it states).
import { apertureFor, ev100, formatShutter, hssCost, nearestMarked } from '../../../exposure/index';
import { formatStops } from '../format';
import { syncSpeedOf } from '../messages';
import { isResult, lookupFrame, requireExif, type CriterionResult, type GradeContext } from '../result';
import { resolveFrames, type Criterion } from '../spec';

type Sync = Extract<Criterion, { kind: 'sync' }>;

// marked speeds differ from their names (1/250 is 1/256 s): a sixth of a stop of slack. common practice, no published source
const SLACK = 2 ** (1 / 6);

export function gradeSync(c: Sync, ctx: GradeContext): CriterionResult {
	const { frame: name } = resolveFrames(c, ctx.spec);
	const sync = syncSpeedOf(ctx.spec, c.syncSpeed);
	const base = { kind: c.kind, target: sync, tolerance: null, unit: 's' as const, comparison: 'at-least' as const, frames: [name] };
	const frame = lookupFrame(ctx, name, base);
	if (isResult(frame)) return frame;
	const exif = requireExif(frame, name, ['exposureTime'], base);
	if (isResult(exif)) return exif;
	const t = exif.exposureTime;
	const within = t >= sync / SLACK;
	const found = `Your shutter was ${formatShutter(t)} s; your camera syncs with flash up to ${formatShutter(sync)} s.`;
	if (within) return { ...base, verdict: 'pass', measured: t, missing: [], message: `${found} The whole frame sees the flash at full power.` };
	// high-speed sync pulses the flash: about a stop to enter it and a stop per doubling of shutter speed
	const cost = hssCost({ shutter: t, syncSpeed: sync });
	const costWords = `in high-speed sync your flash loses about ${formatStops(cost)} of power at this shutter`;
	if (c.highSpeedSync) return { ...base, verdict: 'pass', measured: t, missing: [], message: `${found} This assignment allows high-speed sync: ${costWords}, so keep the flash close.` };
	// the same ambient at sync: close the aperture by the shutter's stops above sync (APEX: EV fixed)
	const { fNumber, iso } = frame.exif;
	let keep = '';
	if (fNumber !== null && iso !== null) {
		const n = apertureFor({ ev100: ev100({ aperture: fNumber, shutter: t, iso }), shutter: sync, iso });
		if (n <= 64) keep = ` For the same ambient at ${formatShutter(sync)} s, close down to about ${nearestMarked(n, 'aperture').label} (or add ND).`;
	}
	return {
		...base,
		verdict: 'fail',
		measured: t,
		missing: [],
		message: `${found} Above sync speed the shutter curtains shade part of the frame unless the flash is in high-speed sync, and ${costWords}.${keep}`
	};
}

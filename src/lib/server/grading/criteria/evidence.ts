// Evidence shared by the flash criteria: the lift predicted from what the learner used, and the blown-subject note.
import { ev100, flashStops, hssCost, mix } from '../../../exposure/index';
import { syncSpeedOf } from '../messages';
import type { Frame } from '../../analysis/index';
import type { GradeContext } from '../result';

// a flash-lit subject this much blown out earns a note on the verdict. common practice, no published source
export const BLOWN_NOTE_SHARE = 0.25;

export function blownNote(share: number): string {
	return share >= BLOWN_NOTE_SHARE
		? ` Note: about ${Math.round(share * 100)} % of the flash-lit subject is blown out (pure white, no detail): turn the flash down or move it back.`
		: '';
}

/**
 * The lift the learner's stated flash should give: flash exposure on the subject from guide number, power and
 * distance (ISO 1230 guide numbers, inverse-square, less the high-speed-sync cost) against the ambient on the subject (the reference frame's
 * metered exposure moved by the settings change), combined with the engine's mix. null without all three values.
 */
export function predictedLift(ctx: GradeContext, ref: Frame, lit: Frame, _measured: number): number | null {
	const used = ctx.used;
	const e = lit.exif;
	const r = ref.exif;
	if (!used?.gn || !used.distance || e.fNumber === null || e.iso === null || e.exposureTime === null) return null;
	if (r.fNumber === null || r.iso === null || r.exposureTime === null) return null;
	// ambient on the subject relative to a correct exposure: a reference at its meter is correct (bias taken out)
	const metered = ev100({ aperture: r.fNumber, shutter: r.exposureTime, iso: r.iso }) + (r.exposureBias ?? 0);
	const ambientStops = metered - ev100({ aperture: e.fNumber, shutter: e.exposureTime, iso: e.iso });
	// above sync the pulsed flash loses power (high-speed sync)
	const hss = hssCost({ shutter: e.exposureTime, syncSpeed: syncSpeedOf(ctx.spec) });
	const flash = flashStops({ gn: used.gn, power: used.power ?? 1, distance: used.distance, aperture: e.fNumber, iso: e.iso }) - hss;
	return mix({ ambientStops, flashStops: flash }) - ambientStops;
}

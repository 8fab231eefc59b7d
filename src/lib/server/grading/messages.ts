// Advice computed through the exposure engine: which marked shutter or aperture reaches a wanted exposure.
import { apertureFor, equivalentExposures, falloffStops, formatAperture, formatShutter, hssCost, mix, nearestMarked } from '../../exposure/index';
import { DEFAULT_SYNC_SPEED } from './spec';

export interface Settings {
	exposureTime: number;
	fNumber: number;
	iso: number;
}

export function formatSettings(s: Settings): string {
	return `${formatShutter(s.exposureTime)} s, ${formatAperture(s.fNumber)}, ISO ${Math.round(s.iso)}`;
}

/** Marked shutter at this aperture and ISO that gives `ev100`, or null beyond the shutter dial (1/8000–30 s). */
export function shutterForEv(ev100: number, fNumber: number, iso: number): string | null {
	const [row] = equivalentExposures(ev100, { iso, apertures: [fNumber] });
	return row ? row.shutterLabel : null;
}

/** Marked aperture at this shutter and ISO that gives `ev100`, or null beyond f/1–f/64. */
export function apertureForEv(ev100: number, exposureTime: number, iso: number): string | null {
	const exact = apertureFor({ ev100, shutter: exposureTime, iso });
	if (!(exact >= 1 / Math.SQRT2 && exact <= 64 * Math.SQRT2)) return null;
	return nearestMarked(exact, 'aperture').label;
}

/**
 * "At f/8, ISO 100 that means 1/1000 s instead of 1/500 s." — keeps aperture and ISO (they set the
 * flash) and moves the shutter (which sets the ambient); falls back to the aperture past the dial.
 */
export function adviseExposure(current: Settings, wantedEv100: number): string | null {
	const nowShutter = formatShutter(current.exposureTime);
	const shutter = shutterForEv(wantedEv100, current.fNumber, current.iso);
	if (shutter && shutter !== nowShutter) {
		return `At ${formatAperture(current.fNumber)}, ISO ${Math.round(current.iso)} that means ${shutter} s instead of ${nowShutter} s.`;
	}
	const aperture = apertureForEv(wantedEv100, current.exposureTime, current.iso);
	const nowAperture = formatAperture(current.fNumber);
	if (aperture && aperture !== nowAperture) {
		return `At ${nowShutter} s, ISO ${Math.round(current.iso)} that means ${aperture} instead of ${nowAperture}.`;
	}
	return null;
}

/** The sync speed a criterion or advice uses: the spec's, else the common 1/250 s. */
export function syncSpeedOf(spec: { syncSpeed?: number }, override?: number): number {
	return override ?? spec.syncSpeed ?? DEFAULT_SYNC_SPEED;
}

/**
 * How to get `more` stops of flash over the ambient on the subject, each way computed with the engine: flash power
 * (power steps), distance (inverse-square), or a faster shutter, which below sync darkens only the ambient but above
 * sync costs the flash as much (high-speed sync), so it is offered only while it stays within sync.
 */
export function liftAdvice(current: { exposureTime: number | null; lift: number; wanted: number }, syncSpeed: number): string {
	const ratioNow = current.lift > 0 ? Math.log2(2 ** current.lift - 1) : -Infinity;
	const ratioWanted = Math.log2(2 ** current.wanted - 1);
	// stops more flash (ambient unchanged) that reach the wanted lift: mix(0, ratio) = lift
	const moreFlash = Number.isFinite(ratioNow) ? ratioWanted - ratioNow : null;
	const parts: string[] = [];
	if (moreFlash !== null && moreFlash > 0) {
		const closer = 2 ** (-moreFlash / 2);
		// check: falloffStops(closer, 1) = moreFlash by the inverse-square law
		const gain = falloffStops(closer, 1);
		parts.push(`give the flash about ${formatStopsShort(moreFlash)} more power, or bring it to ${Math.round(closer * 100)} % of its distance (${formatStopsShort(gain)} more light by the inverse-square law)`);
	} else {
		parts.push('bring the flash much closer or turn its power up: it added almost nothing to the subject');
	}
	const t = current.exposureTime;
	if (t !== null) {
		// darkening the ambient by k stops raises the lift to mix(−k, ratio) + k; find the k that reaches the wanted lift
		const k = Number.isFinite(ratioNow) ? ambientStopsFor(ratioNow, current.wanted) : null;
		if (k !== null && k > 0) {
			const faster = t / 2 ** k;
			const cost = hssCost({ shutter: faster, syncSpeed }) - hssCost({ shutter: t, syncSpeed });
			if (cost <= 0) parts.push(`or darken the ambient with a ${nearestMarked(faster, 'shutter').label} s shutter (the flash is unaffected below your ${formatShutter(syncSpeed)} s sync speed)`);
			else parts.push(`a faster shutter would not help: above your ${formatShutter(syncSpeed)} s sync speed, high-speed sync costs the flash ${formatStopsShort(cost)} for that change, as much as the ambient loses`);
		}
	}
	return `To lift the subject ${formatStopsShort(current.wanted)} above the ambient, ${parts.join('; ')}.`;
}

// solve mix({ ambientStops: −k, flashStops: ratio }) + k = wanted for k ≥ 0 (the lift grows with k)
function ambientStopsFor(ratio: number, wanted: number): number | null {
	const liftAt = (k: number) => mix({ ambientStops: -k, flashStops: ratio }) + k;
	if (liftAt(0) >= wanted) return 0;
	if (liftAt(8) < wanted) return null;
	let lo = 0;
	let hi = 8;
	for (let i = 0; i < 40; i++) {
		const mid = (lo + hi) / 2;
		if (liftAt(mid) >= wanted) hi = mid;
		else lo = mid;
	}
	return hi;
}

function formatStopsShort(v: number): string {
	const r = Math.round(v * 10) / 10;
	return `${r} ${r === 1 ? 'stop' : 'stops'}`;
}

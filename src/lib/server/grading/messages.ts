// Advice computed through the exposure engine: which marked shutter or aperture reaches a wanted exposure.
import { apertureFor, equivalentExposures, formatAperture, formatShutter, nearestMarked } from '../../exposure/index';

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

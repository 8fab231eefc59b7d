// Flash and ambient as two separate exposures on the subject, and their sum: the maths behind the split widgets.
import { ev100, flashStops, hssCost, mix } from '$lib/exposure';

/** One bar of a stops chart: a light alone, in stops from a correct exposure. */
export type StopBar = { label: string; stops: number; tone: 'flash' | 'ambient' | 'neutral'; testid: string };

/** Share of the subject's light that comes from the flash, 0–1, for each light alone in stops. */
// With exposures E = 2^stops, the share is E_f / (E_a + E_f) = 1 / (1 + 2^(a − f)).
export function flashShareOf(ambientStops: number, flashStops: number): number {
	if (flashStops === -Infinity) return 0;
	if (ambientStops === -Infinity) return 1;
	return 1 / (1 + 2 ** (ambientStops - flashStops));
}

export interface SplitInput {
	/** Daylight as the meter reads it, EV at ISO 100. */
	sceneEv: number;
	aperture: number;
	shutter: number;
	iso: number;
	/** Full-power guide number (m, ISO 100), power fraction, flash-to-subject distance (m). */
	gn: number;
	power: number;
	distance: number;
	sync: number;
	/** Stops lost on switching to high-speed sync; the engine's default when left out. */
	entryLoss?: number;
}

/** Ambient and flash on the subject, each in stops from correct, the high-speed-sync cost and their sum. */
export function exposureSplit(input: SplitInput) {
	const settingsEv = ev100({ aperture: input.aperture, shutter: input.shutter, iso: input.iso });
	// Settings with a higher EV than the scene let in less light: that many stops under.
	const ambient = input.sceneEv - settingsEv;
	const hss = hssCost({ shutter: input.shutter, syncSpeed: input.sync, entryLoss: input.entryLoss });
	const flash = flashStops({ gn: input.gn, power: input.power, distance: input.distance, aperture: input.aperture, iso: input.iso }) - hss;
	const subject = mix({ ambientStops: ambient, flashStops: flash });
	return { settingsEv, ambient, hss, flash, subject, share: flashShareOf(ambient, flash) };
}

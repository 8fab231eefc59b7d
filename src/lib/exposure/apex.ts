// Exposure value arithmetic (APEX): EV at ISO 100, stops between settings, metering and luminance.
import { ExposureInputError, requireFinite, requirePositive } from './errors';

/** Camera settings: aperture as f-number N, shutter in seconds, ISO arithmetic speed. */
export interface ExposureSettings {
	aperture: number;
	shutter: number;
	iso: number;
}

/** Settings of a frame plus its exposure compensation in stops (Exif ExposureBiasValue). */
export interface MeteredSettings extends ExposureSettings {
	exposureBias?: number;
}

function checkSettings(s: ExposureSettings): void {
	if (s === null || typeof s !== 'object') {
		throw new ExposureInputError('settings must be an object { aperture, shutter, iso }');
	}
	requirePositive('aperture', s.aperture, '(f-number)');
	requirePositive('shutter', s.shutter, 's');
	requirePositive('iso', s.iso);
}

/** Aperture value Av = log2(N²), in stops (APEX). */
export function apertureValue(aperture: number): number {
	return 2 * Math.log2(requirePositive('aperture', aperture, '(f-number)'));
}

/** Time value Tv = −log2(t), in stops (APEX); `shutter` in seconds. */
export function timeValue(shutter: number): number {
	return -Math.log2(requirePositive('shutter', shutter, 's'));
}

/** Speed value Sv = log2(ISO / 3.125), in stops; the Exif definition, so ISO 100 → Sv 5. */
// Pinned to Exif (CIPA DC-008 Annex C) rather than PH2.5's log2(0.3·S), because Exif files are what we read.
export function speedValue(iso: number): number {
	return Math.log2(requirePositive('iso', iso) / 3.125);
}

/** Exposure value referred to ISO 100: log2(N²/t) − log2(ISO/100), in EV (stops). */
export function ev100(settings: ExposureSettings): number {
	checkSettings(settings);
	const { aperture, shutter, iso } = settings;
	return Math.log2((aperture * aperture) / shutter) - Math.log2(iso / 100);
}

/** How many stops less light setting `b` gives than `a` (positive = `b` is darker), in stops. */
export function stopsBetween(a: ExposureSettings, b: ExposureSettings): number {
	return ev100(b) - ev100(a);
}

/** EV100 the meter judged correct for a frame shot with exposure compensation, in EV. */
// A +1 bias gave the frame one stop more light than metered, so the scene meters one EV higher than the frame's settings.
export function meteredEv(settings: MeteredSettings): number {
	const bias = settings?.exposureBias === undefined ? 0 : requireFinite('exposureBias', settings.exposureBias);
	return ev100(settings) + bias;
}

/** Shutter time that gives `ev100` at this aperture and ISO, in seconds (exact, not rounded to a mark). */
export function shutterFor(args: { ev100: number; aperture: number; iso?: number }): number {
	const ev = requireFinite('ev100', args?.ev100);
	const n = requirePositive('aperture', args.aperture, '(f-number)');
	const iso = requirePositive('iso', args.iso ?? 100);
	return (n * n) / 2 ** (ev + Math.log2(iso / 100));
}

/** F-number that gives `ev100` at this shutter time (s) and ISO, unitless (exact, not rounded to a mark). */
export function apertureFor(args: { ev100: number; shutter: number; iso?: number }): number {
	const ev = requireFinite('ev100', args?.ev100);
	const t = requirePositive('shutter', args.shutter, 's');
	const iso = requirePositive('iso', args.iso ?? 100);
	return Math.sqrt(t * 2 ** (ev + Math.log2(iso / 100)));
}

/** Reflected-light meter calibration constant K commonly used by camera makers, in cd·s/m² (ISO 2720 allows 10.6–13.4). */
export const DEFAULT_METER_K = 12.5;

/** Average scene luminance that meters as `ev100`, in cd/m² (ISO 2720: N²/t = L·S/K). */
export function luminanceFromEv(ev: number, k: number = DEFAULT_METER_K): number {
	return (2 ** requireFinite('ev100', ev) * requirePositive('K', k)) / 100;
}

/** EV100 a reflected meter reads for a scene luminance in cd/m², in EV (ISO 2720). */
export function evFromLuminance(luminance: number, k: number = DEFAULT_METER_K): number {
	return Math.log2((requirePositive('luminance', luminance, 'cd/m²') * 100) / requirePositive('K', k));
}

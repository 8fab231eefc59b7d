// The camera and the lights of a rendered scene, in the engine's terms: exposure from EV, flash from guide
// numbers and inverse square, colour from Kelvin, gels in mireds and a Kelvin white balance.
import { ev100, luminanceFromEv, type ExposureSettings } from '../../exposure/apex';
import { xyFromCct, xyzFromXy } from '../../exposure/chromaticity';
import { applyGel, type GelId } from '../../exposure/colour';
import { flashStops, hssCost } from '../../exposure/flash';
import { mulMat, type Mat3, type Vec3 } from '../../exposure/matrix';
import { SRGB_TO_XYZ, SRGB_WHITE_XYZ, XYZ_TO_SRGB, xyzToLinearSrgb } from '../../exposure/srgb';
import { bradfordMatrix } from '../../exposure/swatch';

/** Daylight (sun and sky together) in kelvin. Common practice, no published source: "daylight" is quoted as 5000–5600 K. */
export const DAYLIGHT_K = 5500;
/** A bare flash tube is made to match daylight; common practice, no published source. */
export const BARE_FLASH_K = 5500;
/** Typical sync speed of the cameras in the course, in seconds. Common practice, no published source. */
export const TYPICAL_SYNC_S = 1 / 250;

/** The camera: exposure settings, its Kelvin white balance and its flash sync speed (seconds). */
export interface Camera extends ExposureSettings {
	wbK: number;
	syncSpeed?: number;
}

/** An off-camera flash: where it is (metres, camera at the origin looking along +z), its full-power ISO 100 guide number (m), power fraction and gel. */
export interface Flash {
	at: Vec3;
	gn: number;
	power?: number;
	gel?: GelId;
	/** Where the head points (a point in the scene); without it the flash lights every way alike. */
	aim?: Vec3;
	/** Half-angle of the beam in degrees, where its light has fallen to about a third (default 30°). */
	beam?: number;
}

/** How much of the beam reaches direction `dir` (unit vector from the flash): 1 on its axis, falling off smoothly. */
// A gaussian in the off-axis angle: a simple stand-in for a reflector's pattern, chosen by eye; no published source.
export function beamFactor(flash: Flash, dir: Vec3): number {
	if (!flash.aim) return 1;
	const ax = flash.aim[0] - flash.at[0];
	const ay = flash.aim[1] - flash.at[1];
	const az = flash.aim[2] - flash.at[2];
	const cos = (ax * dir[0] + ay * dir[1] + az * dir[2]) / Math.hypot(ax, ay, az);
	const angle = Math.acos(Math.min(1, Math.max(-1, cos)));
	const half = ((flash.beam ?? 30) * Math.PI) / 180;
	return Math.exp(-((angle / half) ** 2));
}

/** How much of the metered daylight a frame records: 1 at the meter's settings, ¼ two stops under. */
// Luminance at which the meter's EV renders middle grey, against the camera's: ISO 2720 via the engine.
export function ambientScale(sceneEv: number, camera: Camera): number {
	return luminanceFromEv(sceneEv) / luminanceFromEv(ev100(camera));
}

/** Exposure the flash gives a surface square to it at `distance` metres, as a fraction of correct (1 = GN/d equals the f-number). */
// Guide number and inverse square from the engine; above sync speed the high-speed-sync cost comes off in stops.
export function flashScale(flash: Flash, camera: Camera, distance: number): number {
	const stops = flashStops({ gn: flash.gn, power: flash.power ?? 1, distance, aperture: camera.aperture, iso: camera.iso });
	const hss = hssCost({ shutter: camera.shutter, syncSpeed: camera.syncSpeed ?? TYPICAL_SYNC_S });
	return 2 ** (stops - hss);
}

/** Colour temperature of the flash after its gel (mired shifts add), in kelvin. */
export function flashKelvin(flash: Flash): number {
	return flash.gel ? applyGel(BARE_FLASH_K, flash.gel) : BARE_FLASH_K;
}

/** Linear sRGB of a light at `k` kelvin on the Planckian locus, scaled to luminance Y = 1. */
export function lightRgb(k: number): Vec3 {
	return xyzToLinearSrgb(xyzFromXy(xyFromCct(k)));
}

/** What the camera's Kelvin white balance does to linear sRGB: Bradford from its assumed white to sRGB's white. */
// The same path as the Gel Mixer's swatches, so a picture and a swatch of the same setup agree.
export function whiteBalanceMatrix(wbK: number): Mat3 {
	const assumed = xyzFromXy(xyFromCct(wbK));
	return mulMat(XYZ_TO_SRGB, mulMat(bradfordMatrix(assumed, SRGB_WHITE_XYZ), SRGB_TO_XYZ));
}

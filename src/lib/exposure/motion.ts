// Motion blur in pixels for a subject crossing the frame, and the slowest shutter that keeps it under a limit.
import { ExposureInputError, requireNonNegative, requirePositive } from './errors';

/** Camera and subject: speed across the frame (m/s), subject distance (m), focal length (mm), sensor width (mm), image width (px). */
export interface BlurGeometry {
	speed: number;
	distance: number;
	focalLength: number;
	sensorWidth: number;
	imageWidth: number;
}

// Pixels of image travel per second. Thin lens: magnification f / (d − f); the speed is the component parallel to
// the sensor (motion towards the camera blurs far less and is not modelled).
function pixelsPerSecond(g: BlurGeometry): number {
	if (g === null || typeof g !== 'object') throw new ExposureInputError('blur geometry must be an object');
	const speed = requireNonNegative('speed', g.speed, 'm/s');
	const distanceMm = requirePositive('distance', g.distance, 'm') * 1000;
	const f = requirePositive('focalLength', g.focalLength, 'mm');
	const sensor = requirePositive('sensorWidth', g.sensorWidth, 'mm');
	const pixels = requirePositive('imageWidth', g.imageWidth, 'px');
	if (distanceMm <= f) {
		throw new ExposureInputError(`distance (${g.distance} m) must be beyond the focal length (${f} mm) to form an image`);
	}
	const magnification = f / (distanceMm - f);
	return (speed * 1000 * magnification * pixels) / sensor;
}

/** Blur streak length in pixels for a subject moving across the frame during `exposure` seconds. */
export function motionBlurPx(args: BlurGeometry & { exposure: number }): number {
	const rate = pixelsPerSecond(args);
	return rate * requirePositive('exposure', args.exposure, 's');
}

/** Slowest exposure in seconds that keeps blur at or under `maxBlurPx` pixels (Infinity if the subject is still). */
export function freezeShutter(args: BlurGeometry & { maxBlurPx: number }): number {
	const rate = pixelsPerSecond(args);
	const limit = requirePositive('maxBlurPx', args.maxBlurPx, 'px');
	return rate === 0 ? Infinity : limit / rate;
}

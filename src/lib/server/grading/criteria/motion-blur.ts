// motion-blur: how many pixels a moving subject smears in the graded frame, from its Exif shutter and 35 mm focal length.
import { formatShutter, freezeShutter, motionBlurPx, nearestMarked } from '../../../exposure/index';
import { formatMm } from '../format';
import { isResult, lookupFrame, requireExif, type CriterionResult, type GradeContext } from '../result';
import { resolveFrames, type Criterion } from '../spec';

type MotionBlur = Extract<Criterion, { kind: 'motion-blur' }>;

// A 35 mm equivalent focal length is the one that gives the same view on a 36 × 24 mm frame, so with it the
// sensor's long side is 36 mm whatever the real sensor was (CIPA DC-008, FocalLengthIn35mmFilm).
const FULL_FRAME_LONG_SIDE_MM = 36;

const px = (value: number) => `${value < 10 ? value.toFixed(1) : Math.round(value)} px`;
// speeds and distances as the learner or author wrote them: 8.5, not 8½
const plain = (value: number) => String(Number(value.toFixed(2)));

export function gradeMotionBlur(c: MotionBlur, ctx: GradeContext): CriterionResult {
	const { frame: name } = resolveFrames(c, ctx.spec);
	const base = { kind: c.kind, target: c.maxPx, tolerance: null, unit: 'px' as const, comparison: 'at-most' as const, frames: [name] };
	const frame = lookupFrame(ctx, name, base);
	if (isResult(frame)) return frame;
	const exif = requireExif(frame, name, ['exposureTime', 'focal35'], base);
	if (isResult(exif)) return exif;
	const longSide = frame.pixels ? Math.max(frame.pixels.width, frame.pixels.height) : null;
	if (longSide === null) {
		return {
			...base,
			verdict: 'unknown',
			measured: null,
			missing: [],
			message: `The size of the “${name}” frame in pixels could not be read (${frame.file.label} files cannot be decoded here), so the blur cannot be counted; a mentor will look at it.`
		};
	}
	const geometry = { speed: c.speed, distance: c.distance, focalLength: exif.focal35, sensorWidth: FULL_FRAME_LONG_SIDE_MM, imageWidth: longSide };
	if (c.distance * 1000 <= exif.focal35) {
		return { ...base, verdict: 'unknown', measured: null, missing: [], message: `A subject ${plain(c.distance)} m away cannot be in focus with a ${formatMm(exif.focal35)} lens; a mentor will look at it.` };
	}
	const measured = motionBlurPx({ ...geometry, exposure: exif.exposureTime });
	const speedWords = c.stated ? `the ${plain(c.speed)} m/s you gave for your subject` : `a subject at ${plain(c.speed)} m/s`;
	const found =
		`At ${formatShutter(exif.exposureTime)} s, ${speedWords}, ${plain(c.distance)} m away through a ${formatMm(exif.focal35)} lens ` +
		`(35 mm equivalent), smears about ${px(measured)} across your ${longSide} px frame; the assignment allows ${plain(c.maxPx)} px.`;
	if (measured <= c.maxPx) {
		return { ...base, verdict: 'pass', measured, missing: [], message: `${found} That reads as frozen.` };
	}
	const slowest = freezeShutter({ ...geometry, maxBlurPx: c.maxPx });
	// the nearest marked time at or under the limit, so the advice is a setting the camera has
	const mark = nearestMarked(slowest, 'shutter');
	const advice = mark.value <= slowest ? mark : nearestMarked(mark.value / 2 ** (1 / 3), 'shutter');
	return {
		...base,
		verdict: 'fail',
		measured,
		missing: [],
		message: `${found} A shutter of ${advice.label} s or shorter would keep it within the limit (with high-speed sync for the flash), or stand farther back or zoom wider.`
	};
}

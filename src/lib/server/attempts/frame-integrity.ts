// Upload checks on a frame's pixels that the display copies do not make: big enough to measure, and not damaged.
import sharp from 'sharp';
import { MIN_SIDE } from '../analysis/decode';
import type { FileType } from '../analysis/detect';

/** The smallest side the analysis measures; a smaller frame is refused at upload rather than stored and left ungraded. */
export const MIN_FRAME_SIDE = MIN_SIDE;

/**
 * A lenient decoder fills a cut-short or corrupted JPEG with grey and carries on (a warning, not an error), and the
 * grader would then measure the grey. Decoding once more with warnings treated as failures catches it; a small
 * shrink-on-load decode still reads every coded block. Extra bytes before the end marker, which some cameras
 * write, are harmless and pass.
 */
export async function framePixelsProblem(bytes: Uint8Array, maxPixels: number, type?: FileType): Promise<string | null> {
	// libheif and LibRaw refuse damaged data and too-small frames as they decode (the display copies already did)
	if (type && type.decoder !== 'sharp') return null;
	const meta = await sharp(bytes, { limitInputPixels: maxPixels }).metadata();
	const width = meta.autoOrient?.width ?? meta.width ?? 0;
	const height = meta.autoOrient?.height ?? meta.height ?? 0;
	if (width < MIN_FRAME_SIDE || height < MIN_FRAME_SIDE) {
		return `This image is only ${width} × ${height} pixels. A frame must be at least ${MIN_FRAME_SIDE} × ${MIN_FRAME_SIDE} pixels to be measured; upload the full-size photo from the camera.`;
	}
	try {
		await sharp(bytes, { limitInputPixels: maxPixels, failOn: 'warning' }).resize(128, 128, { fit: 'inside' }).raw().toBuffer();
		return null;
	} catch (error) {
		const message = error instanceof Error ? error.message : String(error);
		if (/extraneous bytes/i.test(message)) return null;
		return 'This photo file is damaged or incomplete (the upload or copy may have been cut short), so it cannot be measured. Copy or export it from the camera again and upload that file.';
	}
}

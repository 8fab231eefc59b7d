// Makes the WebP copies the app shows, upright and stripped of GPS, serial numbers, owner names and all other metadata.
import sharp, { type Sharp } from 'sharp';
import { FrameReadError } from './errors';
import { checkInput, explainSharpError, resolveLimits, sharpInput, type InputLimits } from './decode';
import { cameraFormatForDisplay } from './camera-formats';
import type { FileType } from './detect';

export interface DisplayCopy {
	data: Buffer;
	width: number;
	height: number;
	format: 'webp';
}

export interface DisplayCopies {
	large: DisplayCopy;
	thumbnail: DisplayCopy;
}

export const DISPLAY_SIZE = 1600;
export const THUMBNAIL_SIZE = 400;
const DISPLAY_QUALITY = 82;
const THUMBNAIL_QUALITY = 75;

async function encodeWebp(pipeline: Sharp, quality: number): Promise<DisplayCopy> {
	// sharp writes no Exif, XMP, IPTC or ICC unless asked (keepMetadata/withExif): nothing personal survives
	const { data, info } = await pipeline.webp({ quality }).toBuffer({ resolveWithObject: true });
	return { data, width: info.width, height: info.height, format: 'webp' };
}

// HEIC from libheif's decode; raw rendered from LibRaw's linear decode (raw-levels.ts puts mid-grey where a JPEG does),
// so a raw frame is shown as it was measured. Both arrive upright and with no metadata.
async function cameraFormatPipeline(bytes: Uint8Array, type: FileType, limits: InputLimits): Promise<Sharp> {
	const pixels = await cameraFormatForDisplay(bytes, type, limits, DISPLAY_SIZE);
	const image = sharp(pixels.data, { raw: { width: pixels.width, height: pixels.height, channels: pixels.channels } });
	return (pixels.channels === 4 ? image.removeAlpha() : image).resize({ width: DISPLAY_SIZE, height: DISPLAY_SIZE, fit: 'inside', withoutEnlargement: true });
}

/** Rejects only with FrameReadError (a file that is damaged, too large, or of a format or variant that cannot be decoded). */
export async function displayCopies(bytes: Uint8Array, options: { limits?: Partial<InputLimits> } = {}): Promise<DisplayCopies> {
	const limits = resolveLimits(options.limits);
	const type = checkInput(bytes, limits);
	if (!type.decodable) {
		throw new FrameReadError('not-decodable', `${type.label.charAt(0).toUpperCase()}${type.label.slice(1)} files cannot be shown in the browser here. Upload a JPEG export as well.`);
	}
	try {
		// one decode: orientation applied, sRGB, at display size; both copies come from these pixels
		const pipeline =
			type.decoder === 'sharp'
				? sharpInput(bytes, limits).resize({ width: DISPLAY_SIZE, height: DISPLAY_SIZE, fit: 'inside', withoutEnlargement: true }).toColourspace('srgb')
				: await cameraFormatPipeline(bytes, type, limits);
		const { data, info } = await pipeline.raw().toBuffer({ resolveWithObject: true });
		const raw = { raw: { width: info.width, height: info.height, channels: info.channels } } as const;
		const [large, thumbnail] = await Promise.all([
			encodeWebp(sharp(data, raw), DISPLAY_QUALITY),
			encodeWebp(sharp(data, raw).resize({ width: THUMBNAIL_SIZE, height: THUMBNAIL_SIZE, fit: 'inside', withoutEnlargement: true }), THUMBNAIL_QUALITY)
		]);
		return { large, thumbnail };
	} catch (error) {
		throw explainSharpError(error, limits);
	}
}

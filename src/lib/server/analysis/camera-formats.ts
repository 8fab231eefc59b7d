// Pixels of the formats sharp cannot decode here: phones' HEIC (libheif in WebAssembly) and raw files (LibRaw), for measuring and for showing.
import sharp from 'sharp';
import { analysisSizeFor, ANALYSIS_SIZE, MIN_SIDE, type DecodedImage, type InputLimits } from './decode';
import { FrameReadError } from './errors';
import type { FileType } from './detect';
import { decodeHeif } from './heif';
import { blockFactorFor, renderSrgb8, shrinkLinear } from './linear-image';
import { decodeRaw, type RawInfo } from './raw';

export interface CameraFormatImage {
	/** for measuring: 8-bit sRGB for HEIC, linear 16-bit for raw (`linear: true`) */
	image: DecodedImage;
	/** full size as shown */
	width: number;
	height: number;
	/** what LibRaw read of the settings (raw only) */
	rawInfo: RawInfo | null;
}

function checkSide(width: number, height: number): void {
	if (width < MIN_SIDE || height < MIN_SIDE) {
		throw new FrameReadError('too-small', `This image is only ${width} × ${height} pixels, too small to measure. Upload the full-size photo.`);
	}
}

/** HEIC: decoded whole (libheif has no shrink-on-load), then brought to the analysis size as a JPEG's shrink-on-load would. */
async function heifForAnalysis(bytes: Uint8Array, limits: InputLimits): Promise<CameraFormatImage> {
	const decoded = await decodeHeif(bytes, limits.maxPixels);
	checkSide(decoded.width, decoded.height);
	const target = analysisSizeFor(decoded.width, decoded.height);
	let pipeline = sharp(decoded.data, { raw: { width: decoded.width, height: decoded.height, channels: 4 } }).removeAlpha();
	if (target.shrink > 1) pipeline = pipeline.resize({ width: target.width, height: target.height, fit: 'fill' });
	const { data, info } = await pipeline.raw({ depth: 'uchar' }).toBuffer({ resolveWithObject: true });
	return { image: { data, width: info.width, height: info.height, channels: info.channels }, width: decoded.width, height: decoded.height, rawInfo: null };
}

/** Raw: LibRaw's half-size linear decode, averaged in whole blocks down to the analysis size; the values stay linear. */
async function rawForAnalysis(bytes: Uint8Array, type: FileType, limits: InputLimits): Promise<CameraFormatImage> {
	const { pixels, info } = await decodeRaw(bytes, type.label, limits.maxPixels);
	checkSide(pixels.width, pixels.height);
	const small = shrinkLinear(pixels, blockFactorFor(pixels.width, pixels.height, ANALYSIS_SIZE));
	return { image: { ...small, linear: true }, width: info.width, height: info.height, rawInfo: info };
}

export function decodeCameraFormat(bytes: Uint8Array, type: FileType, limits: InputLimits): Promise<CameraFormatImage> {
	if (type.decoder === 'heif') return heifForAnalysis(bytes, limits);
	if (type.decoder === 'raw') return rawForAnalysis(bytes, type, limits);
	throw new Error(`decodeCameraFormat cannot read ${type.label}`);
}

/** Upright 8-bit sRGB pixels (RGB or RGBA) with the longest side at least `least` where the frame has it: the source of display copies. */
export async function cameraFormatForDisplay(
	bytes: Uint8Array,
	type: FileType,
	limits: InputLimits,
	least: number
): Promise<{ data: Uint8Array; width: number; height: number; channels: 3 | 4 }> {
	if (type.decoder === 'heif') {
		const decoded = await decodeHeif(bytes, limits.maxPixels);
		checkSide(decoded.width, decoded.height);
		return decoded;
	}
	const { pixels } = await decodeRaw(bytes, type.label, limits.maxPixels);
	checkSide(pixels.width, pixels.height);
	const small = shrinkLinear(pixels, blockFactorFor(pixels.width, pixels.height, least));
	return { data: renderSrgb8(small), width: small.width, height: small.height, channels: 3 };
}

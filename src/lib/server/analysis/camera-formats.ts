// Pixels of the formats sharp cannot decode here: phones' HEIC (libheif in WebAssembly) and raw files (LibRaw), for measuring and for showing.
import sharp from 'sharp';
import { analysisSizeFor, ANALYSIS_SIZE, MIN_SIDE, type DecodedImage, type InputLimits } from './decode';
import { FrameReadError } from './errors';
import type { FileType } from './detect';
import { decodeHeif, type HeifPixels } from './heif';
import { convertToSrgb } from './icc-convert';
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

// The file's ICC profile, read from the container by sharp (libheif's header read; sharp's build has no HEVC decoder)
async function heifProfile(bytes: Uint8Array, limits: InputLimits): Promise<Buffer | null> {
	try {
		return (await sharp(bytes, { limitInputPixels: limits.maxPixels }).metadata()).icc ?? null;
	} catch {
		return null;
	}
}

/**
 * Decoded HEIC pixels at `size`, as 8-bit sRGB: libheif gives them in the file's own colour space (phones write Display
 * P3 with an ICC profile), so they are converted by that profile after resizing, as sharp does for a JPEG.
 */
async function heifToSrgb(decoded: HeifPixels, icc: Buffer | null, size: { width: number; height: number } | null) {
	let pipeline = sharp(decoded.data, { raw: { width: decoded.width, height: decoded.height, channels: 4 } }).removeAlpha();
	if (size) pipeline = pipeline.resize({ ...size, fit: 'fill' });
	const { data, info } = await pipeline.raw({ depth: 'uchar' }).toBuffer({ resolveWithObject: true });
	const srgb = icc ? await convertToSrgb(data, info.width, info.height, icc) : data;
	return { data: srgb, width: info.width, height: info.height, channels: 3 as const };
}

/** HEIC: decoded whole (libheif has no shrink-on-load), then brought to the analysis size as a JPEG's shrink-on-load would. */
async function heifForAnalysis(bytes: Uint8Array, limits: InputLimits): Promise<CameraFormatImage> {
	const [decoded, icc] = await Promise.all([decodeHeif(bytes, limits.maxPixels), heifProfile(bytes, limits)]);
	checkSide(decoded.width, decoded.height);
	const target = analysisSizeFor(decoded.width, decoded.height);
	const image = await heifToSrgb(decoded, icc, target.shrink > 1 ? target : null);
	return { image, width: decoded.width, height: decoded.height, rawInfo: null };
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

/** Upright 8-bit sRGB pixels: HEIC at most `least` on the longest side, raw at least `least` where the frame has it (block-averaged); the source of display copies. */
export async function cameraFormatForDisplay(
	bytes: Uint8Array,
	type: FileType,
	limits: InputLimits,
	least: number
): Promise<{ data: Uint8Array; width: number; height: number; channels: 3 | 4 }> {
	if (type.decoder === 'heif') {
		const [decoded, icc] = await Promise.all([decodeHeif(bytes, limits.maxPixels), heifProfile(bytes, limits)]);
		checkSide(decoded.width, decoded.height);
		const scale = Math.min(1, least / Math.max(decoded.width, decoded.height));
		const size = scale < 1 ? { width: Math.max(1, Math.round(decoded.width * scale)), height: Math.max(1, Math.round(decoded.height * scale)) } : null;
		return heifToSrgb(decoded, icc, size);
	}
	const { pixels } = await decodeRaw(bytes, type.label, limits.maxPixels);
	checkSide(pixels.width, pixels.height);
	const small = shrinkLinear(pixels, blockFactorFor(pixels.width, pixels.height, least));
	return { data: renderSrgb8(small), width: small.width, height: small.height, channels: 3 };
}

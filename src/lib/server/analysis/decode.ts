// Safe access to sharp: input checks shared by every reader, and the small decode used for measuring.
import sharp, { type Sharp } from 'sharp';
import { FrameReadError, malformed, tooLarge, tooManyPixels } from './errors';
import { detectFileType, type FileType } from './detect';

export interface InputLimits {
	/** Largest file accepted, bytes (default 40 MB). */
	maxBytes: number;
	/** Largest image accepted, width × height (default 150 MP, above any current camera). */
	maxPixels: number;
}

export const DEFAULT_LIMITS: Readonly<InputLimits> = Object.freeze({
	maxBytes: 40 * 1024 * 1024,
	maxPixels: 150_000_000
});

/**
 * Least longest side of the image that is measured. The decode shrinks by a power of two only (JPEG
 * shrink-on-load, 8×8 DCT scaling), so little is averaged in encoded values; the pixels are then
 * linearised one by one before any further averaging (pixels.ts).
 * Why 720 and not more: a 24 MP frame is then decoded at 750 × 500 (shrink 8) instead of 1500 × 1000 (shrink 4),
 * the decode costs about what a plain resize to 1024 px does, and the levels move by at most 0.05 stop on 3-pixel
 * texture and 0.01 stop on pixel-fine texture (the JPEG's own quantisation has already averaged that), measured on
 * 6000 × 4000 frames of log-normal texture against the full-size frame linearised pixel by pixel. The light grid
 * still has about 19 pixels a cell.
 */
export const ANALYSIS_SIZE = 720;
const SHRINK_FACTORS = [8, 4, 2] as const;

/** The decode size: the frame shrunk by the largest power of two that keeps its longest side at least ANALYSIS_SIZE. */
export function analysisSizeFor(width: number, height: number): { width: number; height: number; shrink: number } {
	const long = Math.max(width, height);
	const shrink = SHRINK_FACTORS.find((f) => long / f >= ANALYSIS_SIZE) ?? 1;
	return { width: Math.ceil(width / shrink), height: Math.ceil(height / shrink), shrink };
}
// smaller than this and there is no subject and background to tell apart
export const MIN_SIDE = 16;

export function resolveLimits(limits: Partial<InputLimits> | undefined): InputLimits {
	return { ...DEFAULT_LIMITS, ...limits };
}

/** Size and type checks that need no decoding; returns the detected type. */
export function checkInput(bytes: Uint8Array, limits: InputLimits): FileType {
	if (!(bytes instanceof Uint8Array) || bytes.length === 0) {
		throw new FrameReadError('empty', 'The file is empty. Please choose the photo again.');
	}
	const type = detectFileType(bytes);
	if (bytes.length > limits.maxBytes) throw tooLarge(bytes.length, limits.maxBytes, type.kind === 'raw');
	if (type.kind === 'unknown') {
		throw new FrameReadError(
			'unsupported-type',
			'This file is not a photo we can read. Upload a JPEG, HEIC or raw file (DNG and the raw formats of common cameras) straight from the camera or phone, or a PNG, WebP, TIFF or AVIF from your editor.'
		);
	}
	if (type.kind === 'gif') {
		throw new FrameReadError('unsupported-type', 'GIF files carry no camera settings. Upload the JPEG from the camera instead.');
	}
	return type;
}

export function sharpInput(bytes: Uint8Array, limits: InputLimits): Sharp {
	// failOn 'error' also refuses truncated data; 'warning' would refuse harmless quirks some cameras write
	return sharp(bytes, { limitInputPixels: limits.maxPixels, failOn: 'error', autoOrient: true });
}

/** Turns anything sharp throws into a FrameReadError. */
export function explainSharpError(error: unknown, limits: InputLimits): FrameReadError {
	if (error instanceof FrameReadError) return error;
	const message = error instanceof Error ? error.message : String(error);
	if (/pixel limit/i.test(message)) return tooManyPixels(null, null, limits.maxPixels);
	return malformed(error);
}

export interface ImageHeader {
	/** Oriented size, as the frame is shown. */
	width: number;
	height: number;
	/** Exif block as sharp found it (WebP and AVIF need this; exifr cannot open those files). */
	exif: Buffer | null;
	/** Already 8-bit sRGB with three channels and upright: the decode can skip conversion and rotation (they cost a pass). */
	plainSrgb?: boolean;
}

export async function readHeader(bytes: Uint8Array, limits: InputLimits): Promise<ImageHeader> {
	try {
		const meta = await sharp(bytes, { limitInputPixels: limits.maxPixels }).metadata();
		const width = meta.autoOrient?.width ?? meta.width;
		const height = meta.autoOrient?.height ?? meta.height;
		if (!width || !height) throw malformed(new Error('no image size in header'));
		if (width * height > limits.maxPixels) throw tooManyPixels(width, height, limits.maxPixels);
		const upright = !meta.orientation || meta.orientation === 1;
		const plainSrgb = meta.space === 'srgb' && meta.channels === 3 && !meta.hasAlpha && meta.depth === 'uchar' && upright && !meta.icc;
		return { width, height, exif: meta.exif ?? null, plainSrgb };
	} catch (error) {
		throw explainSharpError(error, limits);
	}
}

/** The Exif block from a container sharp can parse but not decode (HEIC: libheif reads the header, sharp's build has no HEVC); null when there is none. */
export async function readEmbeddedExif(bytes: Uint8Array, limits: InputLimits): Promise<Buffer | null> {
	const meta = await sharp(bytes, { limitInputPixels: limits.maxPixels }).metadata();
	return meta.exif ?? null;
}

export interface DecodedImage {
	/** 8-bit sRGB codes, or linear 16-bit values when `linear` (raw files) */
	data: Uint8Array | Uint16Array;
	width: number;
	height: number;
	channels: number;
	/** a raw file's linear data: measured as it is, with no sRGB transfer function to undo */
	linear?: boolean;
}

/** Oriented 8-bit sRGB pixels at analysisSizeFor(header size); `size` is the oriented full size from readHeader. */
export async function decodeForAnalysis(
	bytes: Uint8Array,
	limits: InputLimits,
	size: { width: number; height: number; plainSrgb?: boolean }
): Promise<DecodedImage> {
	try {
		const target = analysisSizeFor(size.width, size.height);
		// a plain upright 8-bit sRGB file (most camera JPEGs) needs no rotation or conversion pass: about a third of the decode
		let pipeline = size.plainSrgb ? sharp(bytes, { limitInputPixels: limits.maxPixels, failOn: 'error' }) : sharpInput(bytes, limits);
		// an exact power-of-two size lets libjpeg's scaled decode do all of the shrinking, with no resampling after it
		if (target.shrink > 1) pipeline = pipeline.resize({ width: target.width, height: target.height, fit: 'fill' });
		if (!size.plainSrgb) pipeline = pipeline.toColourspace('srgb').removeAlpha();
		const { data, info } = await pipeline.raw({ depth: 'uchar' }).toBuffer({ resolveWithObject: true });
		if (info.width < MIN_SIDE || info.height < MIN_SIDE) {
			throw new FrameReadError(
				'too-small',
				`This image is only ${info.width} × ${info.height} pixels, too small to measure. Upload the full-size photo.`
			);
		}
		return { data, width: info.width, height: info.height, channels: info.channels };
	} catch (error) {
		throw explainSharpError(error, limits);
	}
}

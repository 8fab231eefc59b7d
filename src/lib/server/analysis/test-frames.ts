// Test helper: builds frames with known light levels, colours and Exif, as a camera would write them.
import { converter } from 'culori';
import sharp, { type Exif } from 'sharp';
import { DEFAULT_SUBJECT_BOX, toPixelBounds, type Box } from './region';
import type { LinearRgb } from './pixels';

export interface TestExif {
	/** seconds; written as a rational like 1/500 */
	exposureTime?: number;
	fNumber?: number;
	iso?: number;
	exposureBias?: number;
	/** raw Exif Flash bit field (CIPA DC-008), e.g. 0x19 fired in auto mode */
	flash?: number;
	focalLength?: number;
	focal35?: number;
	whiteBalance?: 0 | 1;
	make?: string;
	model?: string;
	dateTimeOriginal?: string;
	/** Software and DateTime (the program that last saved the file, and when), as an editor writes them */
	software?: string;
	modifyDate?: string;
	/** Adds GPS, an owner name and a body serial number, to check they never leak. */
	personal?: boolean;
}

export interface TestFrameSpec {
	width?: number;
	height?: number;
	/** Neutral levels in stops from 18 % grey, or explicit linear sRGB colours. */
	subject: { stops: number } | { rgb: LinearRgb };
	background: { stops: number } | { rgb: LinearRgb };
	/**
	 * Stops the background brightens from its left edge to its right, centred on its level (0 = one flat field). A real
	 * background spans levels, and only that lets the pair tell a tone curve from a changed exposure.
	 */
	backgroundRamp?: number;
	box?: Box;
	/** undefined writes no Exif at all */
	exif?: TestExif;
	/** Exif Orientation; the pixels are stored rotated so the shown frame matches `box`. */
	orientation?: 1 | 6;
	format?: 'jpeg' | 'png' | 'webp' | 'tiff';
}

/** Typical settings for an ambient reference frame: 1/500 s, f/8, ISO 100, no bias, flash off. */
export const REFERENCE_EXIF: Readonly<TestExif> = Object.freeze({
	exposureTime: 1 / 500,
	fNumber: 8,
	iso: 100,
	exposureBias: 0,
	flash: 0x10,
	focalLength: 24,
	focal35: 24,
	whiteBalance: 1,
	make: 'Stopwise Test',
	model: 'Bench One',
	dateTimeOriginal: '2024:06:01 10:00:00'
});

export function levelOf(spec: { stops: number } | { rgb: LinearRgb }): LinearRgb {
	if ('rgb' in spec) return spec.rgb;
	const v = 0.18 * 2 ** spec.stops;
	return [v, v, v];
}

// culori's IEC 61966-2-1 encoding, independent of the engine's: a wrong sRGB curve in the engine shows up as a wrong level
const toSrgb = converter('rgb');

function encode([r, g, b]: LinearRgb): [number, number, number] {
	const clamp = (v: number) => Math.min(1, Math.max(0, v));
	const e = toSrgb({ mode: 'lrgb', r: clamp(r), g: clamp(g), b: clamp(b) });
	return [e.r, e.g, e.b].map((v) => Math.round(255 * v)) as [number, number, number];
}

// Exif stores RATIONAL/SRATIONAL; pick the small denominator cameras use (1/500, 56/10, -1/3)
export function toRational(value: number): string {
	if (value > 0 && value < 1 && Math.abs(1 / value - Math.round(1 / value)) < 1e-6) return `1/${Math.round(1 / value)}`;
	for (const d of [1, 2, 3, 10, 100, 1000]) {
		if (Math.abs(value * d - Math.round(value * d)) < 1e-6) return `${Math.round(value * d)}/${d}`;
	}
	return `${Math.round(value * 1e6)}/1000000`;
}

export function buildExif(exif: TestExif): Exif {
	const ifd0: Record<string, string> = {};
	const ifd2: Record<string, string> = {};
	const put = (target: Record<string, string>, tag: string, value: string | number | undefined, asRational = false) => {
		if (value === undefined) return;
		target[tag] = typeof value === 'number' && asRational ? toRational(value) : String(value);
	};
	put(ifd0, 'Make', exif.make);
	put(ifd0, 'Model', exif.model);
	put(ifd0, 'Software', exif.software);
	put(ifd0, 'DateTime', exif.modifyDate);
	put(ifd2, 'ExposureTime', exif.exposureTime, true);
	put(ifd2, 'FNumber', exif.fNumber, true);
	put(ifd2, 'ISOSpeedRatings', exif.iso);
	put(ifd2, 'ExposureBiasValue', exif.exposureBias, true);
	put(ifd2, 'Flash', exif.flash);
	put(ifd2, 'FocalLength', exif.focalLength, true);
	put(ifd2, 'FocalLengthIn35mmFilm', exif.focal35);
	put(ifd2, 'WhiteBalance', exif.whiteBalance);
	put(ifd2, 'DateTimeOriginal', exif.dateTimeOriginal);
	const out: Exif = { IFD0: ifd0, IFD2: ifd2 };
	if (exif.personal) {
		ifd0.Artist = 'Jordan Example (invented)';
		ifd2.CameraOwnerName = 'Jordan Example (invented)';
		ifd2.BodySerialNumber = 'SN-0042-TEST';
		out.IFD3 = { GPSLatitudeRef: 'N', GPSLatitude: '47/1 36/1 1234/100', GPSLongitudeRef: 'W', GPSLongitude: '122/1 19/1 5678/100' };
	}
	return out;
}

/** Raw 8-bit RGB pixels as shown: the background colour with the subject box filled in. */
export function paintPixels(spec: TestFrameSpec): { data: Buffer; width: number; height: number } {
	const width = spec.width ?? 600;
	const height = spec.height ?? 400;
	const level = levelOf(spec.background);
	const ramp = spec.backgroundRamp ?? 0;
	const columns = Array.from({ length: width }, (_, x) => encode(level.map((v) => v * 2 ** (ramp * ((x + 0.5) / width - 0.5))) as LinearRgb));
	const fg = encode(levelOf(spec.subject));
	const { x0, y0, x1, y1 } = toPixelBounds(spec.box ?? DEFAULT_SUBJECT_BOX, width, height);
	const data = Buffer.alloc(width * height * 3);
	for (let y = 0; y < height; y++) {
		for (let x = 0; x < width; x++) {
			const c = x >= x0 && x < x1 && y >= y0 && y < y1 ? fg : columns[x];
			const i = (y * width + x) * 3;
			data[i] = c[0];
			data[i + 1] = c[1];
			data[i + 2] = c[2];
		}
	}
	return { data, width, height };
}

/** Encodes a frame; with orientation 6 the stored pixels are turned so a viewer shows `spec` upright. */
export async function makeFrame(spec: TestFrameSpec): Promise<Buffer> {
	const { data, width, height } = paintPixels(spec);
	let image = sharp(data, { raw: { width, height, channels: 3 } });
	// Orientation 6 means "rotate 90° clockwise to view", so store the picture turned 90° anticlockwise
	if (spec.orientation === 6) image = sharp(await image.rotate(-90).raw().toBuffer(), { raw: { width: height, height: width, channels: 3 } });
	const format = spec.format ?? 'jpeg';
	image =
		format === 'png' ? image.png() : format === 'webp' ? image.webp({ lossless: true }) : format === 'tiff' ? image.tiff() : image.jpeg({ quality: 95, chromaSubsampling: '4:4:4' });
	if (spec.exif) image = image.withExif(buildExif(spec.exif));
	if (spec.orientation) image = image.withMetadata({ orientation: spec.orientation });
	return image.toBuffer();
}

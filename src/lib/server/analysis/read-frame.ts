// Reads one uploaded frame: its camera settings from Exif and its light measured from the pixels.
import { FrameReadError, malformed } from './errors';
import { checkInput, decodeForAnalysis, readEmbeddedExif, readHeader, resolveLimits, type ImageHeader, type InputLimits } from './decode';
import { decodeCameraFormat } from './camera-formats';
import type { FileKind, FileType } from './detect';
import type { RawInfo } from './raw';
import { emptyExifReport, looksLikeCameraRaw, normaliseExif, readExifTags, type ExifReport, type ExifTags } from './exif';
import { measurePixelsInSlices, type PixelMeasures } from './pixels';
import { checkBox, DEFAULT_SUBJECT_BOX, type Box } from './region';

export interface PixelReport extends PixelMeasures {
	/** Full size of the frame as shown (after orientation). */
	width: number;
	height: number;
	/** Size of the image actually measured. */
	analysisWidth: number;
	analysisHeight: number;
	subjectBox: Box;
}

export interface Frame {
	file: { kind: FileKind; label: string; bytes: number };
	exif: ExifReport;
	/** null when the pixels could not be measured; `notes` says why. */
	pixels: PixelReport | null;
	/** Things a learner or mentor should know about how this frame was read. */
	notes: string[];
}

export interface ReadFrameOptions {
	subject?: Box;
	limits?: Partial<InputLimits>;
}

export type ReadFrameResult = { ok: true; frame: Frame } | { ok: false; error: FrameReadError };

async function parseExif(source: Uint8Array, notes: string[]): Promise<ExifTags | null> {
	try {
		return await readExifTags(source);
	} catch {
		notes.push('The camera settings (Exif) in this file are damaged and could not be read.');
		return null;
	}
}

// The block sharp already found is the cheapest to parse, and exifr cannot open WebP or AVIF files itself.
function exifSource(kind: FileKind, bytes: Uint8Array, header: ImageHeader): Uint8Array | null {
	return header.exif ?? (kind === 'jpeg' || kind === 'png' ? bytes : null);
}

async function quietly<T>(work: () => Promise<T>): Promise<T | null> {
	try {
		return await work();
	} catch {
		return null;
	}
}

// HEIC: the Exif item through libheif's header read in sharp (an Exif item may start straight at its TIFF header,
// ISO/IEC 23008-12 annex A, which exifr's own HEIC reader does not follow), then exifr on the whole file.
// Raw: exifr reads the TIFF-based ones (DNG, NEF, ARW, CR2, PEF…); LibRaw's reading is the fallback for the rest.
async function cameraFormatExif(bytes: Uint8Array, type: FileType, limits: InputLimits, notes: string[]): Promise<ExifTags | null> {
	if (type.decoder === 'heif') {
		const block = await quietly(() => readEmbeddedExif(bytes, limits));
		const fromBlock = block ? await quietly(() => readExifTags(block)) : null;
		if (fromBlock) return fromBlock;
	}
	const whole = await quietly(() => readExifTags(bytes));
	if (whole) return whole;
	if (type.decoder === 'heif') notes.push('This file carries no camera settings (Exif) we could read; criteria that need them cannot be checked.');
	return null;
}

// the settings LibRaw read, under the Exif tag names normaliseExif reads
function tagsFromRawInfo(info: RawInfo): ExifTags | null {
	const tags: ExifTags = {};
	if (info.make) tags.Make = info.make;
	if (info.model) tags.Model = info.model;
	if (info.exposureTime) tags.ExposureTime = info.exposureTime;
	if (info.fNumber) tags.FNumber = info.fNumber;
	if (info.iso) tags.ISO = info.iso;
	if (info.focalLength) tags.FocalLength = info.focalLength;
	return Object.keys(tags).length ? tags : null;
}

/** HEIC and raw: decoded by libheif or LibRaw (camera-formats.ts), Exif read meanwhile, measured like any frame. */
async function readCameraFormat(bytes: Uint8Array, type: FileType, file: Frame['file'], subjectBox: Box, limits: InputLimits): Promise<Frame> {
	const notes: string[] = [];
	const decoding = decodeCameraFormat(bytes, type, limits);
	decoding.catch(() => {}); // awaited below; this only stops an early rejection going unhandled
	let tags = await cameraFormatExif(bytes, type, limits, notes);
	const decoded = await decoding;
	if (!tags && decoded.rawInfo) {
		tags = tagsFromRawInfo(decoded.rawInfo);
		if (tags) notes.push('The camera settings were read by the raw decoder; the flash, exposure compensation and white balance tags were not available.');
	}
	if (!tags && notes.length === 0) notes.push('This file carries no camera settings (Exif); criteria that need them cannot be checked.');
	const measures = await measurePixelsInSlices(decoded.image, subjectBox);
	if (decoded.image.linear) notes.push('Measured from the raw data in linear light, with the camera\'s white balance.');
	return {
		file,
		exif: tags ? normaliseExif(tags) : emptyExifReport(),
		pixels: {
			width: decoded.width,
			height: decoded.height,
			analysisWidth: decoded.image.width,
			analysisHeight: decoded.image.height,
			subjectBox: { ...subjectBox },
			...measures
		},
		notes
	};
}

/**
 * Reads a frame from its bytes. Rejects only with FrameReadError, whose message is written for
 * the person who uploaded the file.
 */
export async function readFrame(bytes: Uint8Array, options: ReadFrameOptions = {}): Promise<Frame> {
	try {
		return await readChecked(bytes, options);
	} catch (error) {
		throw error instanceof FrameReadError ? error : malformed(error);
	}
}

async function readChecked(bytes: Uint8Array, options: ReadFrameOptions): Promise<Frame> {
	const limits = resolveLimits(options.limits);
	const subjectBox = options.subject ?? DEFAULT_SUBJECT_BOX;
	const boxProblem = checkBox(subjectBox);
	if (boxProblem) throw new FrameReadError('invalid-region', boxProblem);

	const type = checkInput(bytes, limits);
	const file = { kind: type.kind, label: type.label, bytes: bytes.length };
	if (type.decoder === 'heif' || type.decoder === 'raw') return readCameraFormat(bytes, type, file, subjectBox, limits);

	const notes: string[] = [];
	let tags: ExifTags | null | undefined;
	if (type.kind === 'tiff') {
		// detect.ts tells raw from TIFF by the first directory; Exif saying raw where it did not is decoded as raw all the same
		tags = await parseExif(bytes, notes);
		if (looksLikeCameraRaw(tags)) {
			const raw: FileType = { kind: 'raw', label: 'raw', decodable: true, decoder: 'raw' };
			return readCameraFormat(bytes, raw, { ...file, kind: 'raw', label: 'raw' }, subjectBox, limits);
		}
	}

	// The header (no decoding) sets the decode size; decoding is the slow part, so Exif is read meanwhile.
	const header = await readHeader(bytes, limits);
	const decoding = decodeForAnalysis(bytes, limits, header);
	decoding.catch(() => {}); // awaited below; this only stops an early rejection going unhandled
	if (tags === undefined) {
		const source = exifSource(type.kind, bytes, header);
		tags = source ? await parseExif(source, notes) : null;
	}

	const image = await decoding;
	// in slices: grading runs inside the web process by default, and requests must not wait for a whole frame
	const measures = await measurePixelsInSlices(image, subjectBox);
	const exif = tags ? normaliseExif(tags) : emptyExifReport();
	if (!exif.found && notes.length === 0) notes.push('This file carries no camera settings (Exif); criteria that need them cannot be checked.');
	return {
		file,
		exif,
		pixels: {
			width: header.width,
			height: header.height,
			analysisWidth: image.width,
			analysisHeight: image.height,
			subjectBox: { ...subjectBox },
			...measures
		},
		notes
	};
}

/** readFrame as a value: the form route handlers use, so a bad file is a result, not an exception. */
export async function tryReadFrame(bytes: Uint8Array, options?: ReadFrameOptions): Promise<ReadFrameResult> {
	try {
		return { ok: true, frame: await readFrame(bytes, options) };
	} catch (error) {
		return { ok: false, error: error as FrameReadError };
	}
}

// Reads one uploaded frame: its camera settings from Exif and its light measured from the pixels.
import { FrameReadError, malformed } from './errors';
import { checkInput, decodeForAnalysis, readEmbeddedExif, readHeader, resolveLimits, type ImageHeader, type InputLimits } from './decode';
import type { FileKind } from './detect';
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
	/** null when the pixels could not be measured (HEIC, raw); `notes` says why. */
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

// Labels such as "raw (CR3)" are written mid-sentence; a message that opens with one needs a capital.
function sentenceStart(label: string): string {
	return label.charAt(0).toUpperCase() + label.slice(1);
}

function exifOnlyNote(label: string): string {
	return `Pixels were not measured: ${label} files cannot be decoded here, so only the camera settings were read. Upload a JPEG export for a full check.`;
}

async function quietly<T>(work: () => Promise<T>): Promise<T | null> {
	try {
		return await work();
	} catch {
		return null;
	}
}

// HEIC and RAW: settings only. exifr reads HEIC and TIFF-based RAW itself; libheif (via sharp's
// header read, no decode) is the second try for HEIC containers exifr cannot follow.
async function readUndecodable(bytes: Uint8Array, file: Frame['file'], limits: InputLimits): Promise<Frame> {
	let tags = await quietly(() => readExifTags(bytes));
	if (!tags && file.kind === 'heic') {
		const block = await quietly(() => readEmbeddedExif(bytes, limits));
		if (block) tags = await quietly(() => readExifTags(block));
	}
	if (!tags) {
		throw new FrameReadError(
			'not-decodable',
			`${sentenceStart(file.label)} files cannot be measured here and this one carries no readable camera settings. Upload a JPEG export instead.`
		);
	}
	return { file, exif: normaliseExif(tags), pixels: null, notes: [exifOnlyNote(file.label)] };
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
	if (!type.decodable) return readUndecodable(bytes, file, limits);

	const notes: string[] = [];
	let tags: ExifTags | null | undefined;
	if (type.kind === 'tiff') {
		// NEF, ARW, DNG… are TIFF containers: their first directory says so before any decoding
		tags = await parseExif(bytes, notes);
		if (looksLikeCameraRaw(tags)) {
			return { file: { ...file, kind: 'raw', label: 'raw' }, exif: normaliseExif(tags), pixels: null, notes: [exifOnlyNote('raw'), ...notes] };
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

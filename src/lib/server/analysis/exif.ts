// Reads the Exif tags grading needs and normalises them; a missing or unusable tag becomes null.
import exifr from 'exifr';
import { decodeFlash, type FlashInfo } from './flash';

export interface ExifReport {
	/** false when the file carries no Exif block at all. */
	found: boolean;
	/** seconds */
	exposureTime: number | null;
	fNumber: number | null;
	iso: number | null;
	/** EV, as set on the camera (ExposureBiasValue) */
	exposureBias: number | null;
	flash: FlashInfo | null;
	/** mm, actual */
	focalLength: number | null;
	/** mm, from FocalLengthIn35mmFilm only (never estimated from a crop factor) */
	focal35: number | null;
	whiteBalance: 'auto' | 'manual' | null;
	/** Camera clock, 'YYYY-MM-DDTHH:MM:SS' with the offset when OffsetTimeOriginal gives one. */
	dateTimeOriginal: string | null;
	make: string | null;
	model: string | null;
	/** Software (TIFF 0x0131): a camera's firmware, or the program that last saved the file. Absent in older reports. */
	software?: string | null;
	/** DateTime (TIFF 0x0132), when the file was last saved, 'YYYY-MM-DDTHH:MM:SS'; a camera writes its DateTimeOriginal. Absent in older reports. */
	modifyDate?: string | null;
	/** TIFF/Exif Orientation 1–8 */
	orientation: number | null;
	/** Fields filled from a second-choice tag, e.g. { iso: 'RecommendedExposureIndex' }. */
	sources: Partial<Record<ExifField, string>>;
}

export type ExifField =
	| 'exposureTime'
	| 'fNumber'
	| 'iso'
	| 'exposureBias'
	| 'flash'
	| 'focalLength'
	| 'focal35'
	| 'whiteBalance'
	| 'dateTimeOriginal'
	| 'make'
	| 'model';

/** The Exif tag (CIPA DC-008 name) behind each field, for "the file has no … tag" messages. */
export const EXIF_TAG_NAMES: Record<ExifField, string> = {
	exposureTime: 'ExposureTime',
	fNumber: 'FNumber',
	iso: 'PhotographicSensitivity (ISO)',
	exposureBias: 'ExposureBiasValue',
	flash: 'Flash',
	focalLength: 'FocalLength',
	focal35: 'FocalLengthIn35mmFilm',
	whiteBalance: 'WhiteBalance',
	dateTimeOriginal: 'DateTimeOriginal',
	make: 'Make',
	model: 'Model'
};

// SubfileType (NewSubfileType, 0x00FE), DNGVersion, SubIFD and PhotometricInterpretation tell raw from a TIFF
const IFD0_TAGS = ['Make', 'Model', 'Software', 'ModifyDate', 'Orientation', 'SubIFD', 'SubfileType', 'DNGVersion', 'PhotometricInterpretation'];
const EXIF_TAGS = [
	'ExposureTime',
	'FNumber',
	'ISO',
	'SensitivityType',
	'StandardOutputSensitivity',
	'RecommendedExposureIndex',
	'ISOSpeed',
	'ExposureIndex',
	'ShutterSpeedValue',
	'ApertureValue',
	'ExposureCompensation',
	'Flash',
	'FocalLength',
	'FocalLengthIn35mmFormat',
	'WhiteBalance',
	'DateTimeOriginal',
	'OffsetTimeOriginal'
];

// Raw numbers only (no translated strings, no Date objects), and nothing we do not need:
// no GPS, no maker notes, no owner or serial fields ever enter a report.
const EXIFR_OPTIONS = {
	tiff: true,
	ifd0: { pick: IFD0_TAGS },
	exif: { pick: EXIF_TAGS },
	ifd1: false,
	gps: false,
	interop: false,
	makerNote: false,
	userComment: false,
	xmp: false,
	icc: false,
	iptc: false,
	jfif: false,
	ihdr: false,
	translateValues: false,
	reviveValues: false,
	sanitize: true,
	mergeOutput: true
};

export type ExifTags = Record<string | number, unknown>;

/**
 * Parses Exif from a whole file (JPEG, TIFF, PNG, HEIC) or from a bare TIFF-structured Exif block
 * (as sharp returns for WebP and AVIF). Resolves null when there is no Exif; rejects on damaged data.
 */
export async function readExifTags(source: Uint8Array): Promise<ExifTags | null> {
	const tiff = stripExifHeader(source);
	const parsed = (await exifr.parse(toBuffer(tiff), EXIFR_OPTIONS)) as ExifTags | undefined;
	if (!parsed) return null;
	// exifr reports some damage as an `errors` list instead of throwing
	const { errors, ...tags } = parsed;
	if (Object.keys(tags).length > 0) return tags;
	if (Array.isArray(errors) && errors.length > 0) throw errors[0];
	return null;
}

// sharp hands back the APP1 payload, which starts with "Exif\0\0" before the TIFF header
function stripExifHeader(bytes: Uint8Array): Uint8Array {
	const isHeader =
		bytes.length > 6 && bytes[0] === 0x45 && bytes[1] === 0x78 && bytes[2] === 0x69 && bytes[3] === 0x66 && bytes[4] === 0 && bytes[5] === 0;
	return isHeader ? bytes.subarray(6) : bytes;
}

const toBuffer = (bytes: Uint8Array) =>
	Buffer.isBuffer(bytes) ? bytes : Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);

/** First finite number in a number, numeric string ('1/500' too), array or typed array. */
export function firstNumber(value: unknown): number | null {
	if (typeof value === 'number') return Number.isFinite(value) ? value : null;
	if (typeof value === 'string') {
		const text = value.replace(/\0/g, '').trim();
		const fraction = /^(-?\d+(?:\.\d+)?)\s*\/\s*(\d+(?:\.\d+)?)$/.exec(text);
		const n = fraction ? Number(fraction[1]) / Number(fraction[2]) : text === '' ? NaN : Number(text);
		return Number.isFinite(n) ? n : null;
	}
	if (Array.isArray(value) || ArrayBuffer.isView(value)) {
		for (const item of Array.from(value as ArrayLike<unknown>)) {
			const n = firstNumber(item);
			// cameras write ISO as [100, 0]: the trailing zeros are padding
			if (n !== null && n !== 0) return n;
		}
	}
	return null;
}

function positive(value: unknown): number | null {
	const n = firstNumber(value);
	return n !== null && n > 0 ? n : null;
}

function text(value: unknown): string | null {
	if (typeof value !== 'string') return null;
	const cleaned = value.replace(/\0/g, '').trim();
	return cleaned === '' ? null : cleaned;
}

// PhotographicSensitivity (the ISO tag) is a SHORT and saturates at 65535, which is then no ISO at all. SensitivityType
// (0x8830) says which ISO 12232 quantity the camera recorded: 1 SOS, 2 REI, 3 ISO speed, 4 SOS+REI, 5 SOS+ISO speed,
// 6 REI+ISO speed, 7 all three (CIPA DC-008, 4.6.5); the tag it names is read first, being a LONG that does not saturate.
const ISO_SATURATED = 65535;
const SOS = 'StandardOutputSensitivity';
const REI = 'RecommendedExposureIndex';
const ISO_SPEED = 'ISOSpeed';
const NAMED_BY_TYPE: Record<number, readonly string[]> = {
	1: [SOS],
	2: [REI],
	3: [ISO_SPEED],
	4: [SOS, REI],
	5: [SOS, ISO_SPEED],
	6: [REI, ISO_SPEED],
	7: [SOS, REI, ISO_SPEED]
};
// with no SensitivityType: REI and SOS before ISO speed and the exposure index, as cameras most often fill them
const FALLBACKS = [REI, SOS, ISO_SPEED, 'ExposureIndex'] as const;

// 65535 is the saturated SHORT; the LONG tags may hold more, but never that exact value as a real speed
function isoValue(value: unknown, short = false): number | null {
	const n = positive(value);
	if (n === null || n === ISO_SATURATED || (short && n > ISO_SATURATED)) return null;
	return n;
}

function readIso(tags: ExifTags, sources: ExifReport['sources']): number | null {
	const type = firstNumber(tags.SensitivityType);
	const named = type !== null ? (NAMED_BY_TYPE[type] ?? []) : [];
	for (const tag of named) {
		const value = isoValue(tags[tag]);
		if (value !== null) {
			sources.iso = tag;
			return value;
		}
	}
	const primary = isoValue(tags.ISO, true);
	if (primary !== null) return primary;
	for (const tag of FALLBACKS) {
		const value = isoValue(tags[tag]);
		if (value !== null) {
			sources.iso = tag;
			return value;
		}
	}
	return null;
}

/** The Flash tag's value: an array's first element counts even when it is 0 ("did not fire"). */
function flashValue(value: unknown): number | null {
	if (Array.isArray(value) || ArrayBuffer.isView(value)) {
		const first = Array.from(value as ArrayLike<unknown>)[0];
		return typeof first === 'number' && Number.isFinite(first) ? first : null;
	}
	return firstNumber(value);
}

// APEX values (CIPA DC-008 Annex C): Tv = −log2(t), Av = 2·log2(N); used only when the direct tag is absent
function readExposureTime(tags: ExifTags, sources: ExifReport['sources']): number | null {
	const direct = positive(tags.ExposureTime);
	if (direct !== null) return direct;
	const tv = firstNumber(tags.ShutterSpeedValue);
	if (tv === null || Math.abs(tv) > 30) return null;
	sources.exposureTime = 'ShutterSpeedValue';
	return 2 ** -tv;
}

function readFNumber(tags: ExifTags, sources: ExifReport['sources']): number | null {
	const direct = positive(tags.FNumber);
	if (direct !== null) return direct;
	const av = firstNumber(tags.ApertureValue);
	if (av === null || av < 0 || av > 30) return null;
	sources.fNumber = 'ApertureValue';
	return 2 ** (av / 2);
}

function readBias(tags: ExifTags): number | null {
	const bias = firstNumber(tags.ExposureCompensation);
	// a bias beyond ±15 EV is a broken rational, not a camera setting
	return bias !== null && Math.abs(bias) <= 15 ? bias : null;
}

function readWhiteBalance(tags: ExifTags): ExifReport['whiteBalance'] {
	const code = firstNumber(tags.WhiteBalance);
	return code === 0 ? 'auto' : code === 1 ? 'manual' : null;
}

/** An Exif date ('YYYY:MM:DD HH:MM:SS') as 'YYYY-MM-DDTHH:MM:SS'; null when absent or blank ('0000:00:00 …'). */
function readDate(value: unknown): string | null {
	const raw = text(value);
	const match = raw && /^(\d{4}):(\d{2}):(\d{2})[ T](\d{2}):(\d{2}):(\d{2})/.exec(raw);
	if (!match || match[1] === '0000' || match[2] === '00') return null;
	const [, y, mo, d, h, mi, s] = match;
	return `${y}-${mo}-${d}T${h}:${mi}:${s}`;
}

function readDateTime(tags: ExifTags): string | null {
	const date = readDate(tags.DateTimeOriginal);
	const offset = text(tags.OffsetTimeOriginal);
	return date && `${date}${offset && /^[+-]\d{2}:\d{2}$/.test(offset) ? offset : ''}`;
}

export function emptyExifReport(): ExifReport {
	return {
		found: false,
		exposureTime: null,
		fNumber: null,
		iso: null,
		exposureBias: null,
		flash: null,
		focalLength: null,
		focal35: null,
		whiteBalance: null,
		dateTimeOriginal: null,
		make: null,
		model: null,
		software: null,
		modifyDate: null,
		orientation: null,
		sources: {}
	};
}

export function normaliseExif(tags: ExifTags | null): ExifReport {
	if (!tags) return emptyExifReport();
	const sources: ExifReport['sources'] = {};
	const orientation = firstNumber(tags.Orientation);
	return {
		found: true,
		exposureTime: readExposureTime(tags, sources),
		fNumber: readFNumber(tags, sources),
		iso: readIso(tags, sources),
		exposureBias: readBias(tags),
		flash: decodeFlash(flashValue(tags.Flash)),
		focalLength: positive(tags.FocalLength),
		focal35: positive(tags.FocalLengthIn35mmFormat),
		whiteBalance: readWhiteBalance(tags),
		dateTimeOriginal: readDateTime(tags),
		make: text(tags.Make),
		model: text(tags.Model),
		software: text(tags.Software),
		modifyDate: readDate(tags.ModifyDate),
		orientation: orientation !== null && Number.isInteger(orientation) && orientation >= 1 && orientation <= 8 ? orientation : null,
		sources
	};
}

/**
 * NEF, ARW, DNG and PEF are TIFF containers whose first image is a preview or raw sensor data:
 * DNGVersion, a reduced-resolution first image, CFA/LinearRaw photometrics or SubIFDs give them away.
 */
export function looksLikeCameraRaw(tags: ExifTags | null): boolean {
	if (!tags) return false;
	const photometric = firstNumber(tags.PhotometricInterpretation);
	return (
		tags.DNGVersion !== undefined ||
		firstNumber(tags.SubfileType) === 1 ||
		photometric === 32803 ||
		photometric === 34892 ||
		tags.SubIFD !== undefined
	);
}

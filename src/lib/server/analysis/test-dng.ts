// Test helper: writes a linear DNG by hand (a TIFF with DNG tags) from a scene rendered in linear light, as a camera would.
// Tags, types and meanings: TIFF 6.0 (Adobe, 1992) and the DNG Specification 1.4.0.0 (Adobe, 2012), chapters 4 and 6;
// Exif tags: CIPA DC-008-2019 (Exif 2.32).
import { DEFAULT_SUBJECT_BOX, toPixelBounds } from './region';
import { levelOf, type TestExif, type TestFrameSpec } from './test-frames';
import { RAW_MID_GREY_SHARE } from './raw-levels';

// TIFF field types (TIFF 6.0, section 2)
const ASCII = 2;
const SHORT = 3;
const LONG = 4;
const RATIONAL = 5;
const BYTE = 1;
const SRATIONAL = 10;
const SIZE: Record<number, number> = { [BYTE]: 1, [ASCII]: 1, [SHORT]: 2, [LONG]: 4, [RATIONAL]: 8, [SRATIONAL]: 8 };

interface Entry {
	tag: number;
	type: number;
	/** numbers (a rational as its numerator and denominator, one after the other) or ASCII text */
	values: number[] | string;
}

function count(entry: Entry): number {
	if (typeof entry.values === 'string') return entry.values.length + 1; // NUL-terminated
	return entry.type === RATIONAL || entry.type === SRATIONAL ? entry.values.length / 2 : entry.values.length;
}

function byteLength(entry: Entry): number {
	return count(entry) * SIZE[entry.type];
}

function writeValues(out: Buffer, at: number, entry: Entry): void {
	if (typeof entry.values === 'string') {
		out.write(entry.values, at, 'latin1');
		out[at + entry.values.length] = 0;
		return;
	}
	const step = entry.type === RATIONAL || entry.type === SRATIONAL ? 4 : SIZE[entry.type];
	entry.values.forEach((v, i) => {
		const p = at + i * step;
		if (entry.type === BYTE) out.writeUInt8(v, p);
		else if (entry.type === SHORT) out.writeUInt16LE(v, p);
		else if (entry.type === SRATIONAL) out.writeInt32LE(v, p);
		else out.writeUInt32LE(v, p);
	});
}

const ifdSize = (entries: Entry[]) => 2 + entries.length * 12 + 4;
const overflow = (entries: Entry[]) => entries.reduce((s, e) => s + (byteLength(e) > 4 ? byteLength(e) + (byteLength(e) % 2) : 0), 0);

/** Writes one IFD at `at` with its out-of-line values after it; returns where the next free byte is. */
function writeIfd(out: Buffer, at: number, entries: Entry[]): number {
	const sorted = [...entries].sort((a, b) => a.tag - b.tag); // TIFF 6.0: entries in ascending tag order
	out.writeUInt16LE(sorted.length, at);
	let free = at + ifdSize(sorted);
	sorted.forEach((entry, i) => {
		const p = at + 2 + i * 12;
		out.writeUInt16LE(entry.tag, p);
		out.writeUInt16LE(entry.type, p + 2);
		out.writeUInt32LE(count(entry), p + 4);
		if (byteLength(entry) <= 4) writeValues(out, p + 8, entry);
		else {
			out.writeUInt32LE(free, p + 8);
			writeValues(out, free, entry);
			free += byteLength(entry) + (byteLength(entry) % 2);
		}
	});
	out.writeUInt32LE(0, at + 2 + sorted.length * 12); // no next IFD
	return free;
}

// a rational with the small denominators cameras write
function rational(value: number, signed = false): number[] {
	for (const d of [1, 2, 3, 10, 100, 1000, 10000, 100000]) {
		if (Math.abs(value * d - Math.round(value * d)) < 1e-9) return [Math.round(value * d), d];
	}
	if (!signed && value > 0 && value < 1) return [1, Math.round(1 / value)];
	return [Math.round(value * 1e6), 1e6];
}

function exifEntries(exif: TestExif): Entry[] {
	const out: Entry[] = [];
	const put = (tag: number, type: number, value: number | string | undefined) => {
		if (value === undefined) return;
		if (typeof value === 'string') out.push({ tag, type: ASCII, values: value });
		else if (type === RATIONAL || type === SRATIONAL) out.push({ tag, type, values: rational(value, type === SRATIONAL) });
		else out.push({ tag, type, values: [value] });
	};
	// Exif 2.32 tag numbers (CIPA DC-008-2019, table 7 and following)
	put(0x829a, RATIONAL, exif.exposureTime); // ExposureTime
	put(0x829d, RATIONAL, exif.fNumber); // FNumber
	put(0x8827, SHORT, exif.iso); // PhotographicSensitivity (ISOSpeedRatings)
	put(0x9003, ASCII, exif.dateTimeOriginal); // DateTimeOriginal
	put(0x9204, SRATIONAL, exif.exposureBias); // ExposureBiasValue
	put(0x9209, SHORT, exif.flash); // Flash
	put(0x920a, RATIONAL, exif.focalLength); // FocalLength
	put(0xa403, SHORT, exif.whiteBalance); // WhiteBalance
	put(0xa405, SHORT, exif.focal35); // FocalLengthIn35mmFilm
	return out;
}

// XYZ (D65) to linear sRGB, IEC 61966-2-1 (the inverse of its sRGB-to-XYZ matrix), as the DNG's ColorMatrix1: the "camera" sees linear sRGB
const XYZ_TO_SRGB = [3.2406, -1.5372, -0.4986, -0.9689, 1.8758, 0.0415, 0.0557, -0.204, 1.057];

export interface TestDngSpec extends TestFrameSpec {
	/** true writes a damaged file: the image data stops halfway */
	truncate?: boolean;
	/**
	 * true writes what most cameras record: one sample a photosite behind an RGGB Bayer filter (PhotometricInterpretation
	 * CFA, 32803), 14-bit data above a black level of 512, and a sensor less sensitive to red and blue than to green
	 * (AsShotNeutral 0.5 1 0.7), which the decoder's white balance must undo.
	 */
	cfa?: boolean;
}

// the CFA variant's sensor: black and white levels of a 14-bit camera, and its response to neutral light per channel
const CFA_BLACK = 512;
const CFA_WHITE = 16383;
const CFA_NEUTRAL = [0.5, 1, 0.7];
// DNG 1.4 CFAPattern codes: 0 red, 1 green, 2 blue; RGGB
const RGGB = [0, 1, 1, 2];

/**
 * A DNG whose raw data is linear RGB (PhotometricInterpretation LinearRaw, 34892), 16 bits a sample, uncompressed, white
 * level 65535, black 0, as-shot neutral 1 1 1. A scene level L (0.18 = mid-grey) is stored at L × RAW_MID_GREY_SHARE / 0.18 of
 * the white level, where a camera places metered mid-grey; the Exif settings go in an Exif IFD.
 */
export function makeDng(spec: TestDngSpec): Buffer {
	const width = spec.width ?? 600;
	const height = spec.height ?? 400;
	const scale = RAW_MID_GREY_SHARE / 0.18;
	const code = (v: number) => Math.max(0, Math.min(65535, Math.round(v * scale * 65535)));
	const bg = levelOf(spec.background).map(code);
	const fg = levelOf(spec.subject).map(code);
	const { x0, y0, x1, y1 } = toPixelBounds(spec.box ?? DEFAULT_SUBJECT_BOX, width, height);
	const inBox = (x: number, y: number) => x >= x0 && x < x1 && y >= y0 && y < y1;
	const samples = spec.cfa ? 1 : 3;
	const pixels = Buffer.alloc(width * height * samples * 2);
	for (let y = 0; y < height; y++) {
		for (let x = 0; x < width; x++) {
			if (spec.cfa) {
				const channel = RGGB[(y % 2) * 2 + (x % 2)];
				const level = levelOf(inBox(x, y) ? spec.subject : spec.background)[channel];
				const share = Math.min(1, level * scale * CFA_NEUTRAL[channel]);
				pixels.writeUInt16LE(CFA_BLACK + Math.round(share * (CFA_WHITE - CFA_BLACK)), (y * width + x) * 2);
				continue;
			}
			const c = inBox(x, y) ? fg : bg;
			const i = (y * width + x) * 6;
			pixels.writeUInt16LE(c[0], i);
			pixels.writeUInt16LE(c[1], i + 2);
			pixels.writeUInt16LE(c[2], i + 4);
		}
	}

	const exif = spec.exif ? exifEntries(spec.exif) : [];
	const neutral = spec.cfa ? CFA_NEUTRAL : [1, 1, 1];
	const make = spec.exif?.make ?? 'Stopwise Test';
	const model = spec.exif?.model ?? 'Linear One';
	// DNG 1.4 chapter 4: the raw IFD's tags; offsets are filled in below once the layout is known
	const ifd0: Entry[] = [
		{ tag: 254, type: LONG, values: [0] }, // NewSubFileType: main image
		{ tag: 256, type: LONG, values: [width] }, // ImageWidth
		{ tag: 257, type: LONG, values: [height] }, // ImageLength
		{ tag: 258, type: SHORT, values: Array(samples).fill(16) }, // BitsPerSample
		{ tag: 259, type: SHORT, values: [1] }, // Compression: none
		{ tag: 262, type: SHORT, values: [spec.cfa ? 32803 : 34892] }, // PhotometricInterpretation: CFA or LinearRaw
		{ tag: 271, type: ASCII, values: make }, // Make
		{ tag: 272, type: ASCII, values: model }, // Model
		{ tag: 273, type: LONG, values: [0] }, // StripOffsets (set below)
		{ tag: 274, type: SHORT, values: [1] }, // Orientation
		{ tag: 277, type: SHORT, values: [samples] }, // SamplesPerPixel
		{ tag: 278, type: LONG, values: [height] }, // RowsPerStrip: one strip
		{ tag: 279, type: LONG, values: [pixels.length] }, // StripByteCounts
		{ tag: 284, type: SHORT, values: [1] }, // PlanarConfiguration: chunky
		{ tag: 50706, type: BYTE, values: [1, 4, 0, 0] }, // DNGVersion 1.4.0.0
		{ tag: 50707, type: BYTE, values: [1, 1, 0, 0] }, // DNGBackwardVersion 1.1.0.0
		{ tag: 50708, type: ASCII, values: `${make} ${model}` }, // UniqueCameraModel
		{ tag: 50714, type: LONG, values: spec.cfa ? [CFA_BLACK] : [0, 0, 0] }, // BlackLevel
		{ tag: 50717, type: LONG, values: spec.cfa ? [CFA_WHITE] : [65535, 65535, 65535] }, // WhiteLevel
		// ColorMatrix1, XYZ to the camera's own RGB: linear sRGB scaled per channel by the sensor's response to neutral
		{ tag: 50721, type: SRATIONAL, values: XYZ_TO_SRGB.flatMap((v, i) => [Math.round(v * neutral[Math.floor(i / 3)] * 10000), 10000]) },
		{ tag: 50728, type: RATIONAL, values: neutral.flatMap((v) => rational(v)) }, // AsShotNeutral
		{ tag: 50778, type: SHORT, values: [21] } // CalibrationIlluminant1: D65
	];
	if (spec.cfa) {
		ifd0.push(
			{ tag: 33421, type: SHORT, values: [2, 2] }, // CFARepeatPatternDim
			{ tag: 33422, type: BYTE, values: RGGB }, // CFAPattern
			{ tag: 50710, type: BYTE, values: [0, 1, 2] }, // CFAPlaneColor
			{ tag: 50711, type: SHORT, values: [1] } // CFALayout: rectangular
		);
	}
	if (exif.length) ifd0.push({ tag: 34665, type: LONG, values: [0] }); // ExifIFD pointer (set below)

	const ifd0At = 8;
	const exifAt = ifd0At + ifdSize(ifd0) + overflow(ifd0);
	const dataAt = exifAt + (exif.length ? ifdSize(exif) + overflow(exif) : 0);
	ifd0.find((e) => e.tag === 273)!.values = [dataAt];
	if (exif.length) ifd0.find((e) => e.tag === 34665)!.values = [exifAt];

	const out = Buffer.alloc(dataAt + pixels.length);
	out.write('II', 0, 'latin1');
	out.writeUInt16LE(42, 2);
	out.writeUInt32LE(ifd0At, 4);
	writeIfd(out, ifd0At, ifd0);
	if (exif.length) writeIfd(out, exifAt, exif);
	pixels.copy(out, dataAt);
	return spec.truncate ? out.subarray(0, dataAt + Math.floor(pixels.length / 2)) : out;
}

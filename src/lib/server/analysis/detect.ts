// Tells the file type from its first bytes (never from a name or a browser's claim).

export type FileKind = 'jpeg' | 'png' | 'webp' | 'tiff' | 'avif' | 'heic' | 'raw' | 'gif' | 'unknown';

/** Which decoder reads the pixels: sharp (libvips), libheif in WebAssembly (HEIC/HEIF), or LibRaw (raw files). */
export type Decoder = 'sharp' | 'heif' | 'raw';

export interface FileType {
	kind: FileKind;
	/** Name for people, e.g. 'JPEG', 'HEIC', 'raw (CR3)'. */
	label: string;
	/** Whether the pixels can be decoded here at all (GIF and unknown files cannot). */
	decodable: boolean;
	/** The decoder for the pixels; null when not decodable. */
	decoder: Decoder | null;
}

const sharpType = (kind: FileKind, label: string): FileType => ({ kind, label, decodable: true, decoder: 'sharp' });
const rawType = (format: string | null): FileType => ({ kind: 'raw', label: format ? `raw (${format})` : 'raw', decodable: true, decoder: 'raw' });
const HEIC_TYPE: FileType = { kind: 'heic', label: 'HEIC', decodable: true, decoder: 'heif' };

const ascii = (bytes: Uint8Array, start: number, length: number) =>
	String.fromCharCode(...bytes.subarray(start, start + length));

// ISO BMFF brands (ISO/IEC 23008-12 for HEIF, AV1 Image File Format for AVIF, CR3 uses 'crx ')
const HEIC_BRANDS = new Set(['heic', 'heix', 'hevc', 'hevx', 'heim', 'heis', 'hevm', 'hevs']);

function detectIsoBmff(bytes: Uint8Array): FileType | null {
	if (bytes.length < 16 || ascii(bytes, 4, 4) !== 'ftyp') return null;
	const boxSize = Math.min(
		((bytes[0] << 24) | (bytes[1] << 16) | (bytes[2] << 8) | bytes[3]) >>> 0,
		bytes.length,
		256
	);
	const brands = [ascii(bytes, 8, 4)];
	for (let offset = 16; offset + 4 <= boxSize; offset += 4) brands.push(ascii(bytes, offset, 4));
	if (brands[0] === 'crx ') return rawType('CR3');
	if (brands.includes('avif') || brands.includes('avis')) return sharpType('avif', 'AVIF');
	if (brands.some((b) => HEIC_BRANDS.has(b)) || brands.includes('mif1') || brands.includes('msf1')) return { ...HEIC_TYPE };
	return null;
}

// TIFF 6.0 and DNG 1.4 tags in the first directory that mark a camera's raw file rather than a plain TIFF
const TAG_NEW_SUBFILE_TYPE = 254;
const TAG_PHOTOMETRIC = 262;
const TAG_SUB_IFDS = 330;
const TAG_DNG_VERSION = 50706;
// PhotometricInterpretation CFA (TIFF/EP, 32803) and LinearRaw (DNG, 34892)
const RAW_PHOTOMETRIC = new Set([32803, 34892]);

/** Reads IFD0 of a TIFF (bounds-checked): whether its tags say raw, and whether it is a DNG (the one format its tags name). */
function tiffRawFormat(bytes: Uint8Array): { raw: boolean; format: string | null } {
	const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	const le = bytes[0] === 0x49;
	const u16 = (at: number) => (at + 2 <= bytes.length ? view.getUint16(at, le) : 0);
	const u32 = (at: number) => (at + 4 <= bytes.length ? view.getUint32(at, le) : 0);
	const ifd = u32(4);
	const count = u16(ifd);
	if (ifd < 8 || count === 0 || ifd + 2 + count * 12 > bytes.length) return { raw: false, format: null };
	let raw = false;
	let dng = false;
	for (let i = 0; i < count; i++) {
		const entry = ifd + 2 + i * 12;
		const tag = u16(entry);
		const type = u16(entry + 2);
		const value = type === 3 ? u16(entry + 8) : u32(entry + 8);
		if (tag === TAG_DNG_VERSION) dng = raw = true;
		else if (tag === TAG_SUB_IFDS) raw = true;
		else if (tag === TAG_NEW_SUBFILE_TYPE && value === 1) raw = true; // a reduced-size image first: the raw data lies further on
		else if (tag === TAG_PHOTOMETRIC && RAW_PHOTOMETRIC.has(value)) raw = true;
	}
	// other TIFF-based raw formats carry no tag naming them: they are labelled just "raw"
	return { raw, format: dng ? 'DNG' : null };
}

function detectTiffFamily(bytes: Uint8Array): FileType | null {
	const head = ascii(bytes, 0, 4);
	// ORF and RW2 files alter the TIFF magic number
	if (head === 'IIRO' || head === 'IIRS' || head === 'MMOR') return rawType('ORF');
	if (head === 'IIU\0') return rawType('RW2');
	if (head !== 'II*\0' && head !== 'MM\0*') return null;
	if (ascii(bytes, 8, 2) === 'CR') return rawType('CR2');
	// many raw formats, DNG among them, are TIFF containers: the first directory's tags tell them from a plain TIFF
	const { raw, format } = tiffRawFormat(bytes);
	return raw ? rawType(format) : sharpType('tiff', 'TIFF');
}

export function detectFileType(bytes: Uint8Array): FileType {
	if (bytes.length >= 3 && bytes[0] === 0xff && bytes[1] === 0xd8 && bytes[2] === 0xff) {
		return sharpType('jpeg', 'JPEG');
	}
	if (bytes.length >= 8 && ascii(bytes, 0, 8) === '\x89PNG\r\n\x1a\n') return sharpType('png', 'PNG');
	if (bytes.length >= 12 && ascii(bytes, 0, 4) === 'RIFF' && ascii(bytes, 8, 4) === 'WEBP') return sharpType('webp', 'WebP');
	if (bytes.length >= 6 && (ascii(bytes, 0, 6) === 'GIF87a' || ascii(bytes, 0, 6) === 'GIF89a')) {
		return { kind: 'gif', label: 'GIF', decodable: false, decoder: null };
	}
	if (bytes.length >= 15 && ascii(bytes, 0, 15) === 'FUJIFILMCCD-RAW') return rawType('RAF');
	return detectIsoBmff(bytes) ?? (bytes.length >= 10 ? detectTiffFamily(bytes) : null) ?? {
		kind: 'unknown',
		label: 'unknown',
		decodable: false,
		decoder: null
	};
}

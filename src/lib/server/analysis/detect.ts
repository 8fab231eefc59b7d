// Tells the file type from its first bytes (never from a name or a browser's claim).

export type FileKind = 'jpeg' | 'png' | 'webp' | 'tiff' | 'avif' | 'heic' | 'raw' | 'gif' | 'unknown';

export interface FileType {
	kind: FileKind;
	/** Name for people, e.g. 'JPEG', 'HEIC', 'raw (CR3)'. */
	label: string;
	/** Whether sharp can decode the pixels here (the bundled libvips has no HEVC or RAW decoder). */
	decodable: boolean;
}

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
	if (brands[0] === 'crx ') return { kind: 'raw', label: 'raw (CR3)', decodable: false };
	if (brands.includes('avif') || brands.includes('avis')) return { kind: 'avif', label: 'AVIF', decodable: true };
	if (brands.some((b) => HEIC_BRANDS.has(b)) || brands.includes('mif1') || brands.includes('msf1')) {
		return { kind: 'heic', label: 'HEIC', decodable: false };
	}
	return null;
}

function detectTiffFamily(bytes: Uint8Array): FileType | null {
	const head = ascii(bytes, 0, 4);
	// Olympus ORF and Panasonic RW2 alter the TIFF magic number
	if (head === 'IIRO' || head === 'IIRS' || head === 'MMOR') return { kind: 'raw', label: 'raw (ORF)', decodable: false };
	if (head === 'IIU\0') return { kind: 'raw', label: 'raw (RW2)', decodable: false };
	if (head !== 'II*\0' && head !== 'MM\0*') return null;
	if (ascii(bytes, 8, 2) === 'CR') return { kind: 'raw', label: 'raw (CR2)', decodable: false };
	// NEF, ARW, DNG, PEF… are plain TIFF containers: read-frame tells them apart by their tags
	return { kind: 'tiff', label: 'TIFF', decodable: true };
}

export function detectFileType(bytes: Uint8Array): FileType {
	if (bytes.length >= 3 && bytes[0] === 0xff && bytes[1] === 0xd8 && bytes[2] === 0xff) {
		return { kind: 'jpeg', label: 'JPEG', decodable: true };
	}
	if (bytes.length >= 8 && ascii(bytes, 0, 8) === '\x89PNG\r\n\x1a\n') return { kind: 'png', label: 'PNG', decodable: true };
	if (bytes.length >= 12 && ascii(bytes, 0, 4) === 'RIFF' && ascii(bytes, 8, 4) === 'WEBP') {
		return { kind: 'webp', label: 'WebP', decodable: true };
	}
	if (bytes.length >= 6 && (ascii(bytes, 0, 6) === 'GIF87a' || ascii(bytes, 0, 6) === 'GIF89a')) {
		return { kind: 'gif', label: 'GIF', decodable: false };
	}
	if (bytes.length >= 15 && ascii(bytes, 0, 15) === 'FUJIFILMCCD-RAW') {
		return { kind: 'raw', label: 'raw (RAF)', decodable: false };
	}
	return detectIsoBmff(bytes) ?? (bytes.length >= 10 ? detectTiffFamily(bytes) : null) ?? {
		kind: 'unknown',
		label: 'unknown',
		decodable: false
	};
}

import { describe, expect, it } from 'vitest';
import sharp from 'sharp';
import { detectFileType } from './detect';
import { makeDng } from './test-dng';

const bytes = (...parts: (string | number[])[]) =>
	new Uint8Array(parts.flatMap((p) => (typeof p === 'string' ? Array.from(p, (c) => c.charCodeAt(0)) : p)));
// ISO BMFF ftyp box: size, 'ftyp', major brand, minor version, compatible brands
const ftyp = (major: string, ...compatible: string[]) => {
	const size = 16 + 4 * compatible.length;
	return bytes([0, 0, 0, size], 'ftyp', major, [0, 0, 0, 0], ...compatible, [0, 0, 0, 0]);
};

describe('detectFileType', () => {
	it('knows the formats sharp writes from their bytes', async () => {
		const base = sharp({ create: { width: 8, height: 8, channels: 3, background: '#777' } });
		expect(detectFileType(await base.clone().jpeg().toBuffer()).kind).toBe('jpeg');
		expect(detectFileType(await base.clone().png().toBuffer()).kind).toBe('png');
		expect(detectFileType(await base.clone().webp().toBuffer()).kind).toBe('webp');
		expect(detectFileType(await base.clone().tiff().toBuffer()).kind).toBe('tiff');
		expect(detectFileType(await base.clone().avif().toBuffer())).toMatchObject({ kind: 'avif', decodable: true });
		expect(detectFileType(await base.clone().gif().toBuffer()).kind).toBe('gif');
	});

	it('sends HEIC to libheif and raw containers to LibRaw, naming the raw format', () => {
		// ISO/IEC 23008-12 brands, major or compatible
		expect(detectFileType(ftyp('heic', 'mif1', 'heic'))).toMatchObject({ kind: 'heic', decoder: 'heif', decodable: true });
		expect(detectFileType(ftyp('mif1', 'mif1', 'heic'))).toMatchObject({ kind: 'heic', decoder: 'heif' });
		expect(detectFileType(ftyp('crx ', 'crx '))).toMatchObject({ kind: 'raw', label: 'raw (CR3)', decoder: 'raw' });
		expect(detectFileType(bytes('II*', [0], [8, 0, 0, 0], 'CR', [2, 0]))).toMatchObject({ kind: 'raw', label: 'raw (CR2)' });
		expect(detectFileType(bytes('IIRO', [8, 0, 0, 0, 0, 0]))).toMatchObject({ kind: 'raw', label: 'raw (ORF)' });
		expect(detectFileType(bytes('FUJIFILMCCD-RAW 0201'))).toMatchObject({ kind: 'raw', label: 'raw (RAF)' });
	});

	it('tells a DNG from a plain TIFF by the DNGVersion tag of its first directory (DNG 1.4, chapter 4)', async () => {
		expect(detectFileType(makeDng({ width: 32, height: 32, subject: { stops: 0 }, background: { stops: 0 } }))).toMatchObject({ kind: 'raw', label: 'raw (DNG)', decoder: 'raw' });
		const tiff = await sharp({ create: { width: 8, height: 8, channels: 3, background: '#777' } }).tiff().toBuffer();
		expect(detectFileType(tiff)).toMatchObject({ kind: 'tiff', decoder: 'sharp' });
	});

	it('does not trust a name: random bytes and text are unknown', () => {
		const random = new Uint8Array(64).map((_, i) => (i * 73 + 41) % 251);
		expect(detectFileType(random).kind).toBe('unknown');
		expect(detectFileType(bytes('<html>not a photo</html>')).kind).toBe('unknown');
		expect(detectFileType(new Uint8Array(0)).kind).toBe('unknown');
	});
});

import { describe, expect, it } from 'vitest';
import exifr from 'exifr';
import sharp from 'sharp';
import { displayCopies, DISPLAY_SIZE, THUMBNAIL_SIZE } from './display';
import { FrameReadError } from './errors';
import { makeFrame, REFERENCE_EXIF } from './test-frames';
import { makeDng } from './test-dng';
import { makeHeic } from './test-heic';

/** The chunk types of a RIFF/WebP file (RIFF header, then FourCC + size + data, padded to even). */
function webpChunks(bytes: Buffer): string[] {
	expect(bytes.toString('latin1', 0, 4)).toBe('RIFF');
	expect(bytes.toString('latin1', 8, 12)).toBe('WEBP');
	const types: string[] = [];
	for (let offset = 12; offset + 8 <= bytes.length; ) {
		const size = bytes.readUInt32LE(offset + 4);
		types.push(bytes.toString('latin1', offset, offset + 4));
		offset += 8 + size + (size % 2);
	}
	return types;
}

describe('displayCopies', () => {
	it('makes WebP copies with no GPS, owner, serial number or any other metadata', async () => {
		const source = await makeFrame({ width: 2400, height: 1600, subject: { stops: 0 }, background: { stops: -1 }, exif: { ...REFERENCE_EXIF, personal: true } });
		// the source really carries the personal data (so the check below can fail)
		const before = await exifr.parse(source, { gps: true, exif: true, ifd0: {} });
		expect(before.latitude).toBeCloseTo(47.6, 1);
		expect(before.SerialNumber ?? before.BodySerialNumber).toBe('SN-0042-TEST');

		const { large, thumbnail } = await displayCopies(source);
		for (const copy of [large, thumbnail]) {
			expect(webpChunks(copy.data).filter((t) => !['VP8 ', 'VP8L', 'VP8X', 'ALPH'].includes(t))).toEqual([]);
			const meta = await sharp(copy.data).metadata();
			expect(meta.exif).toBeUndefined();
			expect(meta.xmp).toBeUndefined();
			expect(meta.iptc).toBeUndefined();
			expect(copy.data.includes(Buffer.from('SN-0042-TEST'))).toBe(false);
			expect(copy.data.includes(Buffer.from('Jordan Example'))).toBe(false);
		}
	});

	it('the chunk check sees Exif when a WebP does carry it', async () => {
		const withExif = await sharp(await makeFrame({ subject: { stops: 0 }, background: { stops: 0 }, exif: { ...REFERENCE_EXIF, personal: true } }))
			.webp()
			.keepExif()
			.toBuffer();
		expect(webpChunks(withExif)).toContain('EXIF');
	});

	it('sizes the copies at about 1600 and 400 px on the long side, upright', async () => {
		// stored turned, with Orientation 6: a viewer shows it 2400 × 1600
		const source = await makeFrame({ width: 2400, height: 1600, subject: { stops: 0 }, background: { stops: -1 }, orientation: 6, exif: REFERENCE_EXIF });
		const stored = await sharp(source).metadata();
		expect([stored.width, stored.height]).toEqual([1600, 2400]);
		const { large, thumbnail } = await displayCopies(source);
		expect([large.width, large.height]).toEqual([DISPLAY_SIZE, Math.round((DISPLAY_SIZE * 1600) / 2400)]);
		expect(Math.max(thumbnail.width, thumbnail.height)).toBe(THUMBNAIL_SIZE);
		expect(thumbnail.width).toBeGreaterThan(thumbnail.height);
		expect((await sharp(large.data).metadata()).format).toBe('webp');
	});

	it('does not enlarge small frames', async () => {
		const { large } = await displayCopies(await makeFrame({ width: 300, height: 200, subject: { stops: 0 }, background: { stops: 0 } }));
		expect([large.width, large.height]).toEqual([300, 200]);
	});

	it('refuses what it cannot show with a typed error', async () => {
		await expect(displayCopies(Buffer.from('not a photo'))).rejects.toBeInstanceOf(FrameReadError);
		const heic = Buffer.concat([Buffer.from([0, 0, 0, 24]), Buffer.from('ftypheic\0\0\0\0mif1heic', 'latin1'), Buffer.alloc(64)]);
		await expect(displayCopies(heic)).rejects.toMatchObject({ code: 'malformed' });
	});

	it('shows a HEIC from its decoded pixels and a DNG rendered from its linear data, with no metadata', async () => {
		const heic = await makeHeic({ width: 2400, height: 1600, subject: { stops: 0 }, background: { stops: -1 }, exif: { ...REFERENCE_EXIF, personal: true } });
		const dng = makeDng({ width: 2400, height: 1600, subject: { stops: 0 }, background: { stops: -1 }, exif: REFERENCE_EXIF });
		for (const source of [heic, dng]) {
			const { large, thumbnail } = await displayCopies(source);
			expect([large.width, large.height]).toEqual([DISPLAY_SIZE, Math.round((DISPLAY_SIZE * 1600) / 2400)]);
			expect(Math.max(thumbnail.width, thumbnail.height)).toBe(THUMBNAIL_SIZE);
			expect(webpChunks(large.data).filter((t) => !['VP8 ', 'VP8L', 'VP8X', 'ALPH'].includes(t))).toEqual([]);
			expect(large.data.includes(Buffer.from('SN-0042-TEST'))).toBe(false);
		}
		// the DNG's mid-grey subject is shown at sRGB code 118, as a JPEG shows 18 % grey (IEC 61966-2-1: 0.18 encodes to 0.461)
		const { data, info } = await sharp((await displayCopies(dng)).large.data).raw().toBuffer({ resolveWithObject: true });
		const centre = (Math.floor(info.height / 2) * info.width + Math.floor(info.width / 2)) * info.channels;
		expect(Math.abs(data[centre + 1] - 118)).toBeLessThanOrEqual(2);
	});
});

import { describe, expect, it } from 'vitest';
import { deflateSync } from 'node:zlib';
import sharp from 'sharp';
import { FrameReadError } from './errors';
import { readFrame, tryReadFrame } from './read-frame';
import { makeFrame, REFERENCE_EXIF } from './test-frames';
import { makeDng } from './test-dng';
import { makeHeic } from './test-heic';

const MB = 1024 * 1024;

async function rejection(promise: Promise<unknown>): Promise<FrameReadError> {
	try {
		await promise;
	} catch (error) {
		expect(error).toBeInstanceOf(FrameReadError);
		return error as FrameReadError;
	}
	throw new Error('expected a FrameReadError, but the read succeeded');
}

// PNG chunk with its CRC-32 (ISO/IEC 15948 / PNG spec, polynomial 0xEDB88320)
function pngChunk(type: string, data: Buffer): Buffer {
	let crc = 0xffffffff;
	for (const byte of Buffer.concat([Buffer.from(type, 'latin1'), data])) {
		crc ^= byte;
		for (let k = 0; k < 8; k++) crc = crc & 1 ? 0xedb88320 ^ (crc >>> 1) : crc >>> 1;
	}
	const out = Buffer.alloc(12 + data.length);
	out.writeUInt32BE(data.length, 0);
	out.write(type, 4, 'latin1');
	data.copy(out, 8);
	out.writeUInt32BE((crc ^ 0xffffffff) >>> 0, 8 + data.length);
	return out;
}

function pngDeclaring(width: number, height: number): Buffer {
	const ihdr = Buffer.alloc(13);
	ihdr.writeUInt32BE(width, 0);
	ihdr.writeUInt32BE(height, 4);
	ihdr[8] = 8; // bit depth
	ihdr[9] = 2; // truecolour
	const signature = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
	return Buffer.concat([signature, pngChunk('IHDR', ihdr), pngChunk('IDAT', deflateSync(Buffer.alloc(64))), pngChunk('IEND', Buffer.alloc(0))]);
}

// deterministic noise, so JPEG data has real entropy to truncate
function noiseJpeg(width: number, height: number): Promise<Buffer> {
	const data = Buffer.alloc(width * height * 3);
	let seed = 12345;
	for (let i = 0; i < data.length; i++) {
		seed = (seed * 1103515245 + 12345) >>> 0;
		data[i] = seed >>> 24;
	}
	return sharp(data, { raw: { width, height, channels: 3 } }).jpeg({ quality: 90 }).withExif({ IFD2: { ExposureTime: '1/500' } }).toBuffer();
}

describe('readFrame', () => {
	it('measures the subject and background levels a frame was made with', async () => {
		const bytes = await makeFrame({ subject: { stops: 0 }, background: { stops: -2 }, exif: REFERENCE_EXIF });
		const frame = await readFrame(bytes);
		expect(frame.file).toEqual({ kind: 'jpeg', label: 'JPEG', bytes: bytes.length });
		expect(frame.pixels?.subject.stops).toBeCloseTo(0, 1);
		expect(frame.pixels?.background.stops).toBeCloseTo(-2, 1);
		expect(frame.pixels).toMatchObject({ width: 600, height: 400, analysisWidth: 600, analysisHeight: 400 });
		expect(frame.exif).toMatchObject({ found: true, exposureTime: 1 / 500, fNumber: 8, iso: 100, exposureBias: 0 });
		expect(frame.notes).toEqual([]);
	});

	it('measures a subject box given in fractions of the frame', async () => {
		const box = { x: 0.05, y: 0.5, w: 0.3, h: 0.4 };
		const bytes = await makeFrame({ subject: { stops: 1 }, background: { stops: -1 }, box });
		const inBox = await readFrame(bytes, { subject: box });
		expect(inBox.pixels?.subject.stops).toBeCloseTo(1, 1);
		expect(inBox.pixels?.background.stops).toBeCloseTo(-1, 1);
		// the default centred box misses this subject, so it reads background there
		const centred = await readFrame(bytes);
		expect(centred.pixels?.subject.stops).toBeLessThan(0);
	});

	it('applies the Exif orientation before placing the box', async () => {
		const box = { x: 0.1, y: 0.1, w: 0.3, h: 0.2 };
		const bytes = await makeFrame({ subject: { stops: 1 }, background: { stops: -2 }, box, orientation: 6, exif: REFERENCE_EXIF });
		const frame = await readFrame(bytes, { subject: box });
		expect(frame.pixels).toMatchObject({ width: 600, height: 400 });
		expect(frame.pixels?.subject.stops).toBeCloseTo(1, 1);
		expect(frame.pixels?.background.stops).toBeCloseTo(-2, 1);
	});

	it('shrinks large frames by a power of two on load (longest side at least 720) and reports the full size', async () => {
		const bytes = await makeFrame({ width: 3000, height: 2000, subject: { stops: 0 }, background: { stops: -1 } });
		const frame = await readFrame(bytes);
		expect(frame.pixels).toMatchObject({ width: 3000, height: 2000 });
		// 3000 / 4 = 750 ≥ 720 but 3000 / 8 = 375 is not: JPEG shrink-on-load by 4
		expect(frame.pixels).toMatchObject({ analysisWidth: 750, analysisHeight: 500 });
		expect(frame.pixels?.background.stops).toBeCloseTo(-1, 1);
	});

	it('reads PNG and WebP too', async () => {
		for (const format of ['png', 'webp'] as const) {
			const frame = await readFrame(await makeFrame({ subject: { stops: 0 }, background: { stops: -1 }, format, exif: { ...REFERENCE_EXIF, iso: 200 } }));
			expect(frame.file.kind).toBe(format);
			expect(frame.exif.iso, format).toBe(200);
			expect(frame.pixels?.background.stops, format).toBeCloseTo(-1, 1);
		}
	});

	it('reads a file without Exif: every setting null, pixels measured, a note saying so', async () => {
		const frame = await readFrame(await makeFrame({ subject: { stops: 0 }, background: { stops: 0 } }));
		expect(frame.exif.found).toBe(false);
		expect(frame.exif.exposureTime).toBeNull();
		expect(frame.exif.flash).toBeNull();
		expect(frame.pixels).not.toBeNull();
		expect(frame.notes.join(' ')).toMatch(/no camera settings/);
	});

	it('refuses a truncated JPEG with a typed error a person can read', async () => {
		const whole = await noiseJpeg(400, 300);
		const error = await rejection(readFrame(whole.subarray(0, Math.floor(whole.length * 0.6))));
		expect(error.code).toBe('malformed');
		expect(error.message).toMatch(/damaged or incomplete/);
	});

	it('refuses random bytes named .jpg, a JPEG header followed by garbage, and an empty file', async () => {
		const random = Buffer.alloc(4096);
		for (let i = 0; i < random.length; i++) random[i] = (i * 131 + 7) % 256;
		expect((await rejection(readFrame(random))).code).toBe('unsupported-type');
		const fakeJpeg = Buffer.concat([Buffer.from([0xff, 0xd8, 0xff, 0xe0]), random]);
		expect((await rejection(readFrame(fakeJpeg))).code).toBe('malformed');
		expect((await rejection(readFrame(new Uint8Array(0)))).code).toBe('empty');
	});

	it('refuses a PNG whose header declares 100000 × 100000 pixels without decoding it', async () => {
		const error = await rejection(readFrame(pngDeclaring(100_000, 100_000)));
		expect(error.code).toBe('too-many-pixels');
		expect(error.message).toMatch(/megapixels/);
	});

	it('refuses files over the size limit, which callers can set', async () => {
		const bytes = await makeFrame({ subject: { stops: 0 }, background: { stops: 0 } });
		const error = await rejection(readFrame(bytes, { limits: { maxBytes: 1000 } }));
		expect(error.code).toBe('too-large');
		const big = Buffer.concat([bytes, Buffer.alloc(41 * MB)]);
		expect((await rejection(readFrame(big))).code).toBe('too-large');
		expect(error.message).toMatch(/Export a JPEG at full size/);
	});

	it('tells a raw file over the limit by its bytes and points to the JPEG the camera writes beside it', async () => {
		const dng = makeDng({ width: 32, height: 32, subject: { stops: 0 }, background: { stops: 0 } });
		const error = await rejection(readFrame(dng, { limits: { maxBytes: 1000 } }));
		expect(error.code).toBe('too-large');
		expect(error.message).toMatch(/^This raw file is .*RAW\+JPEG/);
	});

	it('honours a smaller pixel limit', async () => {
		const bytes = await makeFrame({ subject: { stops: 0 }, background: { stops: 0 } });
		expect((await rejection(readFrame(bytes, { limits: { maxPixels: 100_000 } }))).code).toBe('too-many-pixels');
	});

	it('refuses a subject box outside the frame', async () => {
		const bytes = await makeFrame({ subject: { stops: 0 }, background: { stops: 0 } });
		const error = await rejection(readFrame(bytes, { subject: { x: 0.8, y: 0.1, w: 0.5, h: 0.2 } }));
		expect(error.code).toBe('invalid-region');
	});

	it('decodes a raw file built as a TIFF with CFA data it cannot hold: a clear error naming raw', async () => {
		// A TIFF whose first directory says CFA (PhotometricInterpretation 32803, TIFF/EP and DNG) but holds no raw data
		const carrier = await sharp({ create: { width: 16, height: 16, channels: 3, background: '#777' } })
			.jpeg()
			.withExif({ IFD0: { Make: 'Example', PhotometricInterpretation: '32803' }, IFD2: { ExposureTime: '1/250', FNumber: '56/10', ISOSpeedRatings: '400' } })
			.toBuffer();
		const { exif } = await sharp(carrier).metadata();
		const error = await rejection(readFrame(exif!.subarray(6))); // the TIFF structure after "Exif\0\0"
		expect(['not-decodable', 'malformed']).toContain(error.code);
		expect(error.message).toMatch(/raw/);
	});
});

describe('readFrame on HEIC and raw files', () => {
	it('measures a HEIC frame like a JPEG and reads its Exif (ISO/IEC 23008-12 Exif item)', async () => {
		const heic = await makeHeic({ width: 640, height: 480, subject: { stops: 1 }, background: { stops: -1 }, exif: REFERENCE_EXIF });
		const frame = await readFrame(heic);
		expect(frame.file).toMatchObject({ kind: 'heic', label: 'HEIC' });
		expect(frame.exif).toMatchObject({ found: true, exposureTime: 1 / 500, fNumber: 8, iso: 100, model: 'Bench One' });
		expect(frame.pixels).toMatchObject({ width: 640, height: 480, analysisWidth: 640, analysisHeight: 480 });
		expect(frame.pixels!.subject.stops).toBeCloseTo(1, 1);
		expect(frame.pixels!.background.stops).toBeCloseTo(-1, 1);
	});

	it('converts a phone\'s Display P3 HEIC to sRGB by its ICC profile before measuring colour', async () => {
		// a saturated blue in linear sRGB; in Display P3 (SMPTE EG 432-1 primaries, D65, the sRGB curve) its blue is about
		// 0.42, so reading the P3 values as sRGB would be 0.03 off; converted by the profile it reads back within 0.01
		const heic = await makeHeic({ width: 640, height: 480, subject: { stops: 0 }, background: { rgb: [0.05, 0.1, 0.45] }, exif: REFERENCE_EXIF, profile: 'p3' });
		const [r, g, b] = (await readFrame(heic)).pixels!.background.rgb;
		expect(Math.abs(r - 0.05)).toBeLessThan(0.01);
		expect(Math.abs(g - 0.1)).toBeLessThan(0.01);
		expect(Math.abs(b - 0.45)).toBeLessThan(0.01);
	});

	it('measures a DNG in linear light: levels as the scene was made, with a note saying so', async () => {
		// mid-grey stored at 10/78 of white, where ISO 12232 saturation-based speed puts a metered 18 % grey (raw-levels.ts)
		const dng = makeDng({ width: 1600, height: 1200, subject: { stops: 1.5 }, background: { stops: -2.5 }, exif: { ...REFERENCE_EXIF, flash: 0x19 } });
		const frame = await readFrame(dng);
		expect(frame.file).toMatchObject({ kind: 'raw', label: 'raw (DNG)' });
		expect(frame.exif).toMatchObject({ exposureTime: 1 / 500, fNumber: 8, iso: 100, make: 'Stopwise Test' });
		expect(frame.exif.flash?.fired).toBe(true);
		// averaged in whole blocks of linear light down to the analysis size (1600 / 2 = 800 ≥ 720)
		expect(frame.pixels).toMatchObject({ width: 1600, height: 1200, analysisWidth: 800, analysisHeight: 600 });
		expect(frame.pixels!.subject.stops).toBeCloseTo(1.5, 2);
		expect(frame.pixels!.background.stops).toBeCloseTo(-2.5, 2);
		expect(frame.notes.join(' ')).toMatch(/linear light/);
	});

	it('decodes Bayer raw data as cameras record it: black level taken off, camera white balance applied, colours kept', async () => {
		// a warm background in linear sRGB, behind an RGGB filter whose red and blue photosites see 0.5 and 0.7 of green
		const dng = makeDng({ width: 1600, height: 1200, cfa: true, subject: { stops: 1 }, background: { rgb: [0.3, 0.18, 0.1] }, exif: REFERENCE_EXIF });
		const frame = await readFrame(dng);
		expect(frame.pixels!.subject.stops).toBeCloseTo(1, 2);
		const [r, g, b] = frame.pixels!.background.rgb;
		expect(r).toBeCloseTo(0.3, 2);
		expect(g).toBeCloseTo(0.18, 2);
		expect(b).toBeCloseTo(0.1, 2);
	});

	it('counts raw highlights at the white level as clipped and leaves them out of the level', async () => {
		// 3 stops over mid-grey is 8 × 0.128 ≈ 1.03 of white: clipped in the raw data
		const frame = await readFrame(makeDng({ subject: { stops: 3 }, background: { stops: -1 } }));
		expect(frame.pixels!.subject.clippedShare).toBeGreaterThan(0.9);
		expect(frame.pixels!.clippedHighlights).toBeGreaterThan(5);
	});

	it('refuses a cut-short DNG and a cut-short HEIC with messages naming the format', async () => {
		const dng = await rejection(readFrame(makeDng({ subject: { stops: 0 }, background: { stops: 0 }, exif: REFERENCE_EXIF, truncate: true })));
		expect(dng.code).toBe('malformed');
		expect(dng.message).toMatch(/raw \(DNG\) file looks damaged or incomplete/);
		const heic = await makeHeic({ subject: { stops: 0 }, background: { stops: 0 }, exif: REFERENCE_EXIF });
		const cut = await rejection(readFrame(heic.subarray(0, Math.floor(heic.length * 0.6))));
		expect(['malformed', 'not-decodable']).toContain(cut.code);
		expect(cut.message).toMatch(/HEIC/);
	});

	it('says which raw format it cannot decode (a CR3 container with no image in it)', async () => {
		const cr3 = Buffer.concat([Buffer.from([0, 0, 0, 24]), Buffer.from('ftypcrx \0\0\0\x01crx isom', 'latin1'), Buffer.alloc(4000, 9)]);
		const error = await rejection(readFrame(cr3));
		expect(error.code).toBe('not-decodable');
		expect(error.message).toMatch(/^This raw \(CR3\) file could not be decoded here/);
	});

	it('says so when the raw decoder is not installed, instead of failing', async () => {
		const path = process.env.PATH;
		process.env.PATH = '/nonexistent';
		try {
			const error = await rejection(readFrame(makeDng({ subject: { stops: 0 }, background: { stops: 0 } })));
			expect(error.code).toBe('not-decodable');
			expect(error.message).toMatch(/^Raw \(DNG\) files cannot be decoded on this server just now/);
		} finally {
			process.env.PATH = path;
		}
	});

	it('refuses a HEIC container with no image in it', async () => {
		const heic = Buffer.concat([Buffer.from([0, 0, 0, 24]), Buffer.from('ftypheic\0\0\0\0mif1heic', 'latin1'), Buffer.alloc(200, 7)]);
		const error = await rejection(readFrame(heic));
		expect(error.code).toBe('malformed');
		expect(error.message).toMatch(/HEIC/);
	});

	it('applies the pixel limit to raw and HEIC files before decoding them', async () => {
		const dng = makeDng({ width: 400, height: 300, subject: { stops: 0 }, background: { stops: 0 } });
		expect((await rejection(readFrame(dng, { limits: { maxPixels: 100_000 } }))).message).toMatch(/400 × 300 pixels/);
		const heic = await makeHeic({ width: 400, height: 300, subject: { stops: 0 }, background: { stops: 0 } });
		expect((await rejection(readFrame(heic, { limits: { maxPixels: 100_000 } }))).code).toBe('too-many-pixels');
	});
});

describe('tryReadFrame', () => {
	it('returns bad files as values, never throwing', async () => {
		const bad = await tryReadFrame(Buffer.from('definitely not a photo'));
		expect(bad.ok).toBe(false);
		if (!bad.ok) expect(bad.error.code).toBe('unsupported-type');
		const good = await tryReadFrame(await makeFrame({ subject: { stops: 0 }, background: { stops: 0 } }));
		expect(good.ok).toBe(true);
	});
});

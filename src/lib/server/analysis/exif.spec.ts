import { describe, expect, it } from 'vitest';
import sharp from 'sharp';
import { firstNumber, looksLikeCameraRaw, normaliseExif, readExifTags } from './exif';
import { makeFrame, REFERENCE_EXIF } from './test-frames';

describe('firstNumber', () => {
	it('reads numbers, rationals written as text, and arrays padded with zeros', () => {
		expect(firstNumber(0.002)).toBe(0.002);
		expect(firstNumber('1/500')).toBe(0.002);
		expect(firstNumber(' 200\0')).toBe(200);
		expect(firstNumber([100, 0])).toBe(100);
		expect(firstNumber([0, 400])).toBe(400);
		expect(firstNumber(new Uint16Array([800, 0]))).toBe(800);
	});

	it('gives null for what is not a number', () => {
		for (const bad of [undefined, null, '', 'auto', NaN, Infinity, 1 / 0, [], new Uint8Array(0), {}]) expect(firstNumber(bad)).toBeNull();
	});
});

describe('normaliseExif', () => {
	it('gives null for every missing field, never a guess', () => {
		const report = normaliseExif({ Make: 'Example' });
		expect(report.found).toBe(true);
		expect(report.make).toBe('Example');
		for (const field of ['exposureTime', 'fNumber', 'iso', 'exposureBias', 'flash', 'focalLength', 'focal35', 'whiteBalance', 'dateTimeOriginal', 'model'] as const) {
			expect(report[field], field).toBeNull();
		}
	});

	it('reports found: false when a file has no Exif at all', () => {
		expect(normaliseExif(null)).toMatchObject({ found: false, iso: null, exposureTime: null });
	});

	it('takes ISO from an array, and from RecommendedExposureIndex when PhotographicSensitivity saturates at 65535', () => {
		// CIPA DC-008-2019 4.6.5: PhotographicSensitivity holds 65535 when the value does not fit; SensitivityType names the tag that does
		expect(normaliseExif({ ISO: [200, 0] }).iso).toBe(200);
		const high = normaliseExif({ ISO: 65535, SensitivityType: 2, RecommendedExposureIndex: 102400 });
		expect(high.iso).toBe(102400);
		expect(high.sources.iso).toBe('RecommendedExposureIndex');
		expect(normaliseExif({ StandardOutputSensitivity: 320 }).iso).toBe(320);
		expect(normaliseExif({ ISO: 0 }).iso).toBeNull();
	});

	it('reads the ISO tag SensitivityType names first, and never reports 65535 as an ISO', () => {
		// CIPA DC-008-2019 4.6.5 tag 0x8830: 1 = SOS, 3 = ISO speed, 6 = REI and ISO speed (ISO 12232:2019 quantities)
		const sos = normaliseExif({ ISO: 400, SensitivityType: 1, StandardOutputSensitivity: 400, RecommendedExposureIndex: 500 });
		expect(sos).toMatchObject({ iso: 400, sources: { iso: 'StandardOutputSensitivity' } });
		const speed = normaliseExif({ ISO: 65535, SensitivityType: 3, ISOSpeed: 80000, RecommendedExposureIndex: 64000 });
		expect(speed).toMatchObject({ iso: 80000, sources: { iso: 'ISOSpeed' } });
		const both = normaliseExif({ ISO: 65535, SensitivityType: 6, ISOSpeed: 70000 });
		expect(both).toMatchObject({ iso: 70000, sources: { iso: 'ISOSpeed' } });
		// saturated everywhere: no ISO at all, so criteria needing it say which tag is missing
		expect(normaliseExif({ ISO: 65535 }).iso).toBeNull();
		expect(normaliseExif({ ISO: 65535, SensitivityType: 2, RecommendedExposureIndex: 65535 }).iso).toBeNull();
	});

	it('reads a Flash tag of [0] as "did not fire", not as missing', () => {
		// CIPA DC-008-2019 4.6.5 tag 0x9209: value 0 = flash did not fire
		const flash = normaliseExif({ Flash: [0] }).flash;
		expect(flash).not.toBeNull();
		expect(flash?.fired).toBe(false);
		expect(normaliseExif({ Flash: 0 }).flash?.fired).toBe(false);
		expect(normaliseExif({ Flash: [0x19] }).flash?.fired).toBe(true);
	});

	it('falls back to the APEX tags when ExposureTime or FNumber is missing', () => {
		// APEX (CIPA DC-008-2019 Annex C): Tv = −log2 t, so Tv 9 is 1/512 s; Av = 2·log2 N, so Av 6 is f/8
		const r = normaliseExif({ ShutterSpeedValue: 9, ApertureValue: 6 });
		expect(r.exposureTime).toBeCloseTo(1 / 512, 10);
		expect(r.fNumber).toBeCloseTo(8, 10);
		expect(r.sources).toEqual({ exposureTime: 'ShutterSpeedValue', fNumber: 'ApertureValue' });
	});

	it('refuses broken rationals instead of passing them on', () => {
		const r = normaliseExif({ ExposureTime: Infinity, FNumber: 0, ExposureCompensation: NaN, FocalLength: -3 });
		expect([r.exposureTime, r.fNumber, r.exposureBias, r.focalLength]).toEqual([null, null, null, null]);
		expect(normaliseExif({ ExposureCompensation: 4294967 }).exposureBias).toBeNull();
	});

	it('maps WhiteBalance 0/1 to auto/manual (CIPA DC-008 tag 0xA403) and nothing else', () => {
		expect(normaliseExif({ WhiteBalance: 0 }).whiteBalance).toBe('auto');
		expect(normaliseExif({ WhiteBalance: 1 }).whiteBalance).toBe('manual');
		expect(normaliseExif({ WhiteBalance: 7 }).whiteBalance).toBeNull();
	});

	it('normalises the camera clock and keeps the offset when there is one', () => {
		expect(normaliseExif({ DateTimeOriginal: '2024:06:01 10:00:00' }).dateTimeOriginal).toBe('2024-06-01T10:00:00');
		expect(normaliseExif({ DateTimeOriginal: '2024:06:01 10:00:00', OffsetTimeOriginal: '-07:00' }).dateTimeOriginal).toBe('2024-06-01T10:00:00-07:00');
		expect(normaliseExif({ DateTimeOriginal: '0000:00:00 00:00:00' }).dateTimeOriginal).toBeNull();
		expect(normaliseExif({ DateTimeOriginal: '    ' }).dateTimeOriginal).toBeNull();
	});
});

describe('readExifTags', () => {
	it('reads back what a camera-like file carries, as raw numbers', async () => {
		const jpeg = await makeFrame({ subject: { stops: 0 }, background: { stops: 0 }, exif: { ...REFERENCE_EXIF, exposureBias: -1 / 3, flash: 0x19 } });
		const r = normaliseExif(await readExifTags(jpeg));
		expect(r).toMatchObject({
			exposureTime: 1 / 500,
			fNumber: 8,
			iso: 100,
			focalLength: 24,
			focal35: 24,
			whiteBalance: 'manual',
			make: 'Stopwise Test',
			model: 'Bench One',
			dateTimeOriginal: '2024-06-01T10:00:00'
		});
		expect(r.exposureBias).toBeCloseTo(-1 / 3, 10);
		expect(r.flash).toMatchObject({ fired: true, mode: 'auto', raw: 0x19 });
	});

	it('reads the Exif block sharp returns for WebP (which exifr cannot open itself)', async () => {
		const webp = await makeFrame({ subject: { stops: 0 }, background: { stops: 0 }, format: 'webp', exif: { ...REFERENCE_EXIF, iso: 400 } });
		const { exif } = await sharp(webp).metadata();
		expect(exif).toBeDefined();
		expect(normaliseExif(await readExifTags(exif!)).iso).toBe(400);
	});

	it('resolves null for a file without Exif', async () => {
		const jpeg = await makeFrame({ subject: { stops: 0 }, background: { stops: 0 } });
		expect(await readExifTags(jpeg)).toBeNull();
	});

	it('tells raw TIFF containers from ordinary TIFF by their first directory', () => {
		expect(looksLikeCameraRaw({ PhotometricInterpretation: 32803 })).toBe(true); // CFA, TIFF/EP and DNG
		expect(looksLikeCameraRaw({ DNGVersion: [1, 4, 0, 0] })).toBe(true);
		expect(looksLikeCameraRaw({ SubfileType: 1 })).toBe(true);
		expect(looksLikeCameraRaw({ PhotometricInterpretation: 2, Make: 'Example' })).toBe(false);
		expect(looksLikeCameraRaw(null)).toBe(false);
	});
});

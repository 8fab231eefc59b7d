// The padded JPEG the upload tests and benches send: exactly the size asked, still the same picture with its Exif.
import { describe, expect, it } from 'vitest';
import sharp from 'sharp';
import exifr from 'exifr';
import { makeFrame, REFERENCE_EXIF } from '../../analysis/test-frames';
import { padJpeg } from './padded-jpeg';

describe('padJpeg', () => {
	it('makes a JPEG of exactly the size asked that decodes to the same picture and keeps its Exif', async () => {
		const jpeg = await makeFrame({ width: 300, height: 200, subject: { stops: 0 }, background: { stops: 0.5 }, exif: { ...REFERENCE_EXIF } });
		const padded = padJpeg(jpeg, 3 * 1024 * 1024 + 7);
		expect(padded.length).toBe(3 * 1024 * 1024 + 7);
		const [a, b] = await Promise.all([sharp(jpeg).raw().toBuffer(), sharp(padded).raw().toBuffer()]);
		expect(b.equals(a)).toBe(true);
		expect((await exifr.parse(padded))?.ExposureTime).toBe((await exifr.parse(jpeg))?.ExposureTime);
	});
});

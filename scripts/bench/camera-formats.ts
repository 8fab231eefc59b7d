// Benchmark: reading a phone's 12 MP HEIC pair and a 16 MP raw (Bayer DNG) pair against the floor of their decoders alone.
import { execFile } from 'node:child_process';
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import exifr from 'exifr';
import sharp from 'sharp';
import { readFrame } from '../../src/lib/server/analysis/index';
import { decodeHeif } from '../../src/lib/server/analysis/heif';
import { decodeRaw } from '../../src/lib/server/analysis/raw';
import { makeDng } from '../../src/lib/server/analysis/test-dng';
import { REFERENCE_EXIF } from '../../src/lib/server/analysis/test-frames';
import { ms, timeInterleaved, type Bench } from './timing';

const run = promisify(execFile);
// reading a frame adds the measuring pass (and, for HEIC, a resize to the analysis size) to its decoder's own time
const TARGET_RATIO = 1.5;
const PHONE = { width: 4032, height: 3024 };
const CAMERA = { width: 4928, height: 3264 };

/** A photo-like phone frame (noise, so HEVC has detail to decode), encoded by Debian's heif-enc as a phone would. */
async function makePhoneHeic(level: number, exposureTime: string): Promise<Buffer> {
	const { width, height } = PHONE;
	const data = Buffer.alloc(width * height * 3);
	let seed = 0x2545f491;
	for (let i = 0; i < data.length; i++) {
		seed = (seed * 1664525 + 1013904223) >>> 0;
		data[i] = level + (seed >>> 28) - 8;
	}
	const folder = await mkdtemp(join(tmpdir(), 'stopwise-bench-heic-'));
	try {
		const jpeg = join(folder, 'frame.jpg');
		await sharp(data, { raw: { width, height, channels: 3 } })
			.jpeg({ quality: 92 })
			.withExif({ IFD0: { Make: 'Stopwise Bench', Model: 'Phone 12' }, IFD2: { ExposureTime: exposureTime, FNumber: '18/10', ISOSpeedRatings: '50' } })
			.toFile(jpeg);
		await run('heif-enc', ['-q', '80', '-o', join(folder, 'frame.heic'), jpeg]);
		return await readFile(join(folder, 'frame.heic'));
	} finally {
		await rm(folder, { recursive: true, force: true });
	}
}

export const cameraFormatsBench: Bench = {
	name: 'HEIC and raw frames (12 MP HEIC pair, 16 MP Bayer DNG pair)',
	async run() {
		const heic = [await makePhoneHeic(150, '1/500'), await makePhoneHeic(90, '1/2000')];
		const dng = [
			makeDng({ ...CAMERA, cfa: true, subject: { stops: 0 }, background: { stops: 0.5 }, exif: REFERENCE_EXIF }),
			makeDng({ ...CAMERA, cfa: true, subject: { stops: 0 }, background: { stops: -1.5 }, exif: { ...REFERENCE_EXIF, exposureTime: 1 / 2000 } })
		];
		sharp.cache(false);
		const limit = 150_000_000;
		const times = await timeInterleaved(
			{
				heicFloor: async () => {
					for (const b of heic) await Promise.all([decodeHeif(b, limit), exifr.parse(b).catch(() => null)]);
				},
				heicRead: async () => {
					for (const b of heic) await readFrame(b);
				},
				rawFloor: async () => {
					for (const b of dng) await Promise.all([decodeRaw(b, 'raw (DNG)', limit), exifr.parse(b)]);
				},
				rawRead: async () => {
					for (const b of dng) await readFrame(b);
				}
			},
			{ warmup: 1, iterations: 5 }
		);
		const heicRatio = times.heicRead / times.heicFloor;
		const rawRatio = times.rawRead / times.rawFloor;
		const ok = heicRatio <= TARGET_RATIO && rawRatio <= TARGET_RATIO;
		const mb = (bs: Buffer[]) => bs.map((b) => (b.length / 1e6).toFixed(1)).join(' + ');
		return {
			ok,
			lines: [
				`HEIC: 2 × ${PHONE.width}×${PHONE.height} (${mb(heic)} MB); floor (libheif decode in its thread + exifr) median ${ms(times.heicFloor)}, readFrame × 2 median ${ms(times.heicRead)}: ratio ${heicRatio.toFixed(2)} (target ≤ ${TARGET_RATIO})`,
				`raw:  2 × ${CAMERA.width}×${CAMERA.height} uncompressed Bayer DNG (${mb(dng)} MB); floor (LibRaw identify + half-size decode + exifr) median ${ms(times.rawFloor)}, readFrame × 2 median ${ms(times.rawRead)}: ratio ${rawRatio.toFixed(2)} (target ≤ ${TARGET_RATIO})`,
				ok ? 'OK' : 'MISSED'
			]
		};
	}
};

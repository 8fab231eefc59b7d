// Benchmark: grading a pair of 24 MP JPEGs against the floor (sharp's decode at the analysis size plus exifr's parse).
import exifr from 'exifr';
import sharp from 'sharp';
import { analysisSizeFor, readFrame } from '../../src/lib/server/analysis/index';
import { grade, type AssignmentSpecInput } from '../../src/lib/server/grading/index';
import { ms, timeInterleaved, type Bench } from './timing';

const WIDTH = 6000;
const HEIGHT = 4000;
const TARGET_RATIO = 1.3;
// The floor as the target was set: sharp's decode to 1024 px (what a plain resize before measuring would decode) plus
// exifr. Grading decodes at its own analysis size (analysisSizeFor), printed beside it.
const FLOOR_SIZE = 1024;

const SPEC: AssignmentSpecInput = {
	frames: ['reference', 'lit'],
	criteria: [
		{ kind: 'ambient-under', stops: 2, tolerance: 0.34 },
		{ kind: 'subject-lift', minStops: 1 },
		{ kind: 'background-drop', tolerance: 0.5 },
		{ kind: 'shutter-min', seconds: 0.001 },
		{ kind: 'flash-evidence' },
		{ kind: 'background-cooler', minMired: 60 },
		{ kind: 'focal-max', mm35: 35 }
	]
};

/**
 * A photo-like 24 MP frame: a graded background with fine noise (so the JPEG has real detail to
 * decode) and a brighter subject block in the middle. Levels are 8-bit sRGB codes.
 */
export async function makeBenchJpeg(background: [number, number, number], subject: [number, number, number], exposureTime: string, flash: string): Promise<Buffer> {
	const data = Buffer.alloc(WIDTH * HEIGHT * 3);
	let seed = 0x2545f491;
	for (let y = 0; y < HEIGHT; y++) {
		const inRows = y >= HEIGHT * 0.2 && y < HEIGHT * 0.8;
		const shade = Math.round((y / HEIGHT) * 24) - 12;
		for (let x = 0; x < WIDTH; x++) {
			const base = inRows && x >= WIDTH * 0.3 && x < WIDTH * 0.7 ? subject : background;
			seed = (seed * 1664525 + 1013904223) >>> 0;
			const noise = (seed >>> 28) - 8;
			const i = (y * WIDTH + x) * 3;
			data[i] = base[0] + shade + noise;
			data[i + 1] = base[1] + shade + noise;
			data[i + 2] = base[2] + shade + noise;
		}
	}
	return sharp(data, { raw: { width: WIDTH, height: HEIGHT, channels: 3 } })
		.jpeg({ quality: 92 })
		.withExif({
			IFD0: { Make: 'Stopwise Bench', Model: 'Invented 24' },
			IFD2: {
				ExposureTime: exposureTime,
				FNumber: '8/1',
				ISOSpeedRatings: '100',
				ExposureBiasValue: '0/1',
				Flash: flash,
				FocalLength: '24/1',
				FocalLengthIn35mmFilm: '24',
				WhiteBalance: '1',
				DateTimeOriginal: '2024:06:01 10:00:00'
			}
		})
		.toBuffer();
}

async function floorOf(bytes: Buffer, size = FLOOR_SIZE): Promise<void> {
	await sharp(bytes).resize({ width: size, height: size, fit: 'inside' }).raw().toBuffer();
	await exifr.parse(bytes);
}

export const gradingBench: Bench = {
	name: 'grading (two 24 MP JPEGs)',
	async run() {
		const started = performance.now();
		const reference = await makeBenchJpeg([150, 150, 150], [118, 118, 118], '1/500', '16');
		const lit = await makeBenchJpeg([70, 80, 120], [118, 118, 118], '1/2000', '25');
		const made = performance.now() - started;
		// libvips would otherwise cache the repeated decodes and time nothing
		sharp.cache(false);

		let verdict = '';
		const decoded = analysisSizeFor(WIDTH, HEIGHT);
		const times = await timeInterleaved(
			{
				floor: async () => {
					await floorOf(reference);
					await floorOf(lit);
				},
				ownSize: async () => {
					await floorOf(reference, decoded.width);
					await floorOf(lit, decoded.width);
				},
				grading: async () => {
					const frames = { reference: await readFrame(reference), lit: await readFrame(lit) };
					verdict = grade(SPEC, frames).verdict;
				}
			},
			{ warmup: 2, iterations: 9 }
		);
		const ratio = times.grading / times.floor;
		const ok = ratio <= TARGET_RATIO;
		const ownRatio = times.grading / times.ownSize;
		return {
			ok,
			lines: [
				`frames: 2 × ${WIDTH}×${HEIGHT} JPEG (${(reference.length / 1e6).toFixed(1)} + ${(lit.length / 1e6).toFixed(1)} MB, made in ${ms(made)}), grading decodes at ${decoded.width}×${decoded.height} (shrink-on-load ${decoded.shrink}), verdict ${verdict}`,
				`floor   (sharp decode at ${FLOOR_SIZE} px + exifr parse, both frames): median ${ms(times.floor)}`,
				`grading (readFrame × 2 + grade):                              median ${ms(times.grading)}`,
				`ratio ${ratio.toFixed(2)} × floor (target ≤ ${TARGET_RATIO}) ${ok ? 'OK' : 'MISSED'}`,
				`for reference: ${ownRatio.toFixed(2)} × a decode at grading's own size (${decoded.width} px) + exifr, median ${ms(times.ownSize)}`
			]
		};
	}
};

/** The pair the upload benches send: a reference at 1/500 s and a lit frame at 1/1500 s with the flash fired. */
export async function makeBenchPair(): Promise<{ reference: Buffer; lit: Buffer }> {
	const reference = await makeBenchJpeg([150, 150, 150], [118, 118, 118], '1/500', '16');
	const lit = await makeBenchJpeg([70, 80, 120], [118, 118, 118], '1/1500', '25');
	return { reference, lit };
}

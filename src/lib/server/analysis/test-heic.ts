// Test helper: a HEIC frame made at test time by Debian's heif-enc (libheif-examples, x265) from a JPEG of a known scene, Exif carried over.
import { execFile } from 'node:child_process';
import sharp from 'sharp';
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { makeFrame, type TestFrameSpec } from './test-frames';

const run = promisify(execFile);

/**
 * libheif-js decodes only (its WebAssembly build carries no HEVC encoder), so the fixture is encoded by heif-enc, which
 * `npm test` installs with apt like PostgreSQL. Quality 95 with 4:4:4 chroma keeps flat patches within a few codes.
 */
export async function makeHeic(spec: Omit<TestFrameSpec, 'format' | 'orientation'> & { profile?: 'p3' }): Promise<Buffer> {
	const folder = await mkdtemp(join(tmpdir(), 'stopwise-heic-'));
	try {
		const jpeg = join(folder, 'frame.jpg');
		const heic = join(folder, 'frame.heic');
		let source = await makeFrame({ ...spec, format: 'jpeg' });
		// as a phone does: the pixels in Display P3 with its ICC profile, which heif-enc carries into the HEIC
		if (spec.profile === 'p3') source = await sharp(source).withIccProfile('p3').keepExif().jpeg({ quality: 98, chromaSubsampling: '4:4:4' }).toBuffer();
		await writeFile(jpeg, source);
		try {
			await run('heif-enc', ['-q', '95', '-p', 'chroma=444', '-o', heic, jpeg]);
		} catch (error) {
			if ((error as NodeJS.ErrnoException).code === 'ENOENT') {
				throw new Error('heif-enc is not installed: `apt-get install libheif-examples` (npm test installs it)');
			}
			throw error;
		}
		return await readFile(heic);
	} finally {
		await rm(folder, { recursive: true, force: true });
	}
}

// Test helper: a HEIC frame made at test time by Debian's heif-enc (libheif-examples, x265) from a JPEG of a known scene, Exif carried over.
import { execFile } from 'node:child_process';
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
export async function makeHeic(spec: Omit<TestFrameSpec, 'format' | 'orientation'>): Promise<Buffer> {
	const folder = await mkdtemp(join(tmpdir(), 'stopwise-heic-'));
	try {
		const jpeg = join(folder, 'frame.jpg');
		const heic = join(folder, 'frame.heic');
		await writeFile(jpeg, await makeFrame({ ...spec, format: 'jpeg' }));
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

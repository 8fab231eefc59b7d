// Test sources made here, by ffmpeg's own test pattern and tone generators: a small video with or without sound.
import { mkdtemp, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runTool } from './ffmpeg';

export async function makeTestVideo(options: { seconds?: number; width?: number; height?: number; sound?: boolean } = {}): Promise<Buffer> {
	const { seconds = 2, width = 320, height = 240, sound = true } = options;
	const dir = await mkdtemp(join(tmpdir(), 'stopwise-test-video-'));
	try {
		const out = join(dir, 'source.mp4');
		const args = ['-hide_banner', '-nostdin', '-y', '-f', 'lavfi', '-i', `testsrc=size=${width}x${height}:rate=15:duration=${seconds}`];
		if (sound) args.push('-f', 'lavfi', '-i', `sine=frequency=440:duration=${seconds}`);
		args.push('-c:v', 'libx264', '-preset', 'ultrafast', '-pix_fmt', 'yuv420p');
		if (sound) args.push('-c:a', 'aac');
		args.push(out);
		const run = await runTool('ffmpeg', args, { timeoutMs: 60_000 });
		if (run.code !== 0) throw new Error(`ffmpeg could not make the test video: ${run.stderr.slice(-400)}`);
		return await readFile(out);
	} finally {
		await rm(dir, { recursive: true, force: true });
	}
}

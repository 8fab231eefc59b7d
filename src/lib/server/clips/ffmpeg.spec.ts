// ffmpeg's -progress lines (key=value, out_time_us in microseconds: ffmpeg's documentation of -progress) and ffprobe's reading.
import { describe, expect, it } from 'vitest';
import { MediaError, probe, progressOf } from './ffmpeg';
import { makeTestVideo } from './test-video';
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

describe('ffmpeg progress', () => {
	it('reads the share done from out_time_us (and the misnamed out_time_ms, also in microseconds)', () => {
		expect(progressOf('out_time_us=1500000', 3)).toBe(0.5);
		expect(progressOf('out_time_ms=3000000', 3)).toBe(1);
		expect(progressOf('out_time_us=9000000', 3)).toBe(1);
		expect(progressOf('frame=12', 3)).toBeNull();
		expect(progressOf('out_time=00:00:01.500000', 3)).toBeNull();
		expect(progressOf('out_time_us=100', 0)).toBeNull();
	});
});

describe('ffprobe', () => {
	it('reads length, picture size and sound of a video, and refuses a file that is not one', async () => {
		const dir = await mkdtemp(join(tmpdir(), 'stopwise-probe-'));
		try {
			await writeFile(join(dir, 'a.mp4'), await makeTestVideo({ seconds: 1, width: 320, height: 180, sound: false }));
			const info = await probe(join(dir, 'a.mp4'));
			expect(info).toMatchObject({ width: 320, height: 180, hasAudio: false });
			expect(info.durationSeconds).toBeCloseTo(1, 1);
			await writeFile(join(dir, 'b.mp4'), 'hello, not a video');
			await expect(probe(join(dir, 'b.mp4'))).rejects.toBeInstanceOf(MediaError);
		} finally {
			await rm(dir, { recursive: true, force: true });
		}
	});
});

// From a source video to the stored web renditions and poster of one clip: probe and limits first, then one ffmpeg run,
// then the file store. On any failure nothing is left: neither in the store nor in the private temporary folder.
import { mkdtemp, readFile, rm, stat } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { ClipRendition } from '../db/json-types';
import { fileStore } from '../storage/index';
import { MediaError, posterFrame, probe, transcode, type Probe } from './ffmpeg';
import { clipKey, clipFolder, POSTER_FILE, RENDITION_HEIGHTS } from './keys';
import { clipLimits, type ClipLimits } from './limits';

export interface StoredRenditions {
	renditions: ClipRendition[];
	poster: string;
	durationSeconds: number;
}

const minutes = (s: number) => (s >= 120 ? `${Math.round(s / 60)} minutes` : `${Math.round(s)} seconds`);

/** Refuses a source over the limits, in the author's words. */
export function checkLimits(info: Probe, limits: ClipLimits): void {
	if (info.durationSeconds > limits.seconds) {
		throw new MediaError('too long', `This clip runs ${minutes(info.durationSeconds)}; the limit is ${minutes(limits.seconds)}. Trim it and upload it again.`);
	}
	const longSide = Math.max(info.width, info.height);
	if (longSide > limits.longSide) {
		throw new MediaError('too large a picture', `This clip is ${info.width} × ${info.height} pixels; the longer side may be at most ${limits.longSide}. Export it at 4K or less.`);
	}
}

export async function makeRenditions(clipId: string, source: string, onProgress: (fraction: number) => void, limits = clipLimits()): Promise<StoredRenditions> {
	const store = fileStore();
	const work = await mkdtemp(join(tmpdir(), 'stopwise-clip-'));
	try {
		const info = await probe(source);
		checkLimits(info, limits);
		const outputs = RENDITION_HEIGHTS.map((height) => ({ height, path: join(work, `${height}.mp4`) }));
		await transcode(source, outputs, info, onProgress);
		await posterFrame(source, join(work, POSTER_FILE), info, RENDITION_HEIGHTS[0]);
		const renditions: ClipRendition[] = [];
		for (const o of outputs) {
			const made = await probe(o.path);
			const file = `${o.height}.mp4`;
			renditions.push({ file, type: 'video/mp4', width: made.width, height: made.height, bytes: (await stat(o.path)).size });
			await store.put(clipKey(clipId, file), await readFile(o.path));
		}
		await store.put(clipKey(clipId, POSTER_FILE), await readFile(join(work, POSTER_FILE)));
		return { renditions, poster: POSTER_FILE, durationSeconds: info.durationSeconds };
	} catch (error) {
		await store.deletePrefix(clipFolder(clipId)).catch(() => undefined);
		throw error;
	} finally {
		await rm(work, { recursive: true, force: true });
	}
}

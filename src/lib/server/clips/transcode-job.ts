// The transcoding job of one clip (pg-boss queue `transcode-clip`): claims the clip, makes its renditions with progress
// written as it goes, and ends ready or failed with a message; the uploaded source is removed either way.
import { openQueue, TRANSCODE_QUEUE, wakeGradingWorkers } from '../attempts/queue';
import { removeUploadFiles, uploadsInTransit, type LocalCopy } from '../attempts/uploads/in-transit';
import { MediaError } from './ffmpeg';
import { claimForTranscoding, markFailed, markReady, setProgress } from './records';
import { makeRenditions } from './renditions';
import type { ClipLimits } from './limits';

export interface TranscodeJobData {
	clipId: string;
}

/** Queues a clip's transcoding; the job id is the clip id, so sending twice never transcodes twice at once. */
export async function queueTranscode(clipId: string): Promise<void> {
	const boss = await openQueue();
	await boss.send(TRANSCODE_QUEUE, { clipId } satisfies TranscodeJobData, { id: clipId });
	// the same wake-up as grading: every worker process looks for work at once
	await wakeGradingWorkers();
}

const FAILED = 'The clip could not be processed just now. Upload it again; if it fails again, try another export of it.';

export async function transcodeClip(clipId: string, options: { limits?: ClipLimits } = {}): Promise<'ready' | 'failed' | 'missing'> {
	const clip = await claimForTranscoding(clipId);
	if (!clip?.uploadId) return 'missing';
	const uploadId = clip.uploadId;
	let written = 0;
	let writing: Promise<void> = Promise.resolve();
	// at most a few writes a second: the author's page reads the row about once a second
	const onProgress = (fraction: number) => {
		const now = Date.now();
		if (now - written < 400) return;
		written = now;
		writing = writing.then(() => setProgress(clipId, Math.round(fraction * 1000) / 1000)).catch(() => undefined);
	};
	// the video as a file on this node (copied from the bucket when the uploads wait there): ffmpeg reads a path
	let source: LocalCopy | null = null;
	try {
		source = await uploadsInTransit().localCopy(uploadId);
		if (!source) throw new MediaError(`upload ${uploadId} is gone`, 'The uploaded video is no longer here. Upload it again.');
		const done = await makeRenditions(clipId, source.path, onProgress, options.limits);
		await writing;
		await markReady(clipId, done);
		return 'ready';
	} catch (error) {
		await writing;
		if (!(error instanceof MediaError)) console.error('[clips] transcoding failed', error instanceof Error ? error.message : error);
		await markFailed(clipId, error instanceof MediaError ? error.authorMessage : FAILED);
		return 'failed';
	} finally {
		await source?.release();
		await removeUploadFiles(uploadId);
	}
}

// Checks each uploaded frame and writes its original and display copies (no GPS or personal metadata) to the store.
import { DEFAULT_LIMITS, detectFileType, displayCopies, FrameReadError } from '../analysis/index';
import { framePixelsProblem } from './frame-integrity';
import { fileStore } from '../storage/index';
import { frameKeys, mimeFor, MIME_TYPES } from './keys';
import { maxUploadBytes } from './limits';
import { tooLargeMessage } from '../../attempts/upload-checks';

export interface CheckedFrame {
	name: string;
	index: number;
	/** the original, read again only when it is written, so a checked frame holds no copy of it in memory */
	file: File;
	kind: keyof typeof MIME_TYPES;
	/** for people and the original's extension, e.g. 'raw (DNG)' */
	label: string;
	large: Buffer;
	thumb: Buffer;
}

export interface StoredFrame {
	name: string;
	originalKey: string;
	largeKey: string;
	thumbKey: string;
	mime: string;
	bytes: number;
}


/** Per-frame problems in the learner's words; an empty object when every frame will do. */
export type FrameProblems = Record<string, string>;

/**
 * Type and size by the bytes (never the name), then the display copies, which also prove the file decodes. One frame
 * at a time, its bytes let go before the next is read: an Attempt of several large frames holds one in memory at most.
 */
export async function checkFrames(names: readonly string[], files: Map<string, File>): Promise<{ frames: CheckedFrame[]; problems: FrameProblems }> {
	const limit = maxUploadBytes();
	const problems: FrameProblems = {};
	const frames: CheckedFrame[] = [];
	for (const [index, name] of names.entries()) {
		const file = files.get(name);
		if (!file || file.size === 0) {
			problems[name] = file ? 'This file is empty. Please choose the photo again.' : `The “${name}” frame is missing. Add it and send again.`;
			continue;
		}
		if (file.size > limit) {
			problems[name] = tooLargeMessage(file.size, limit, file.name);
			continue;
		}
		const checked = await checkFrame(name, index, file, limit);
		if ('problem' in checked) problems[name] = checked.problem;
		else frames.push(checked);
	}
	return { frames, problems };
}

async function checkFrame(name: string, index: number, file: File, limit: number): Promise<CheckedFrame | { problem: string }> {
	const bytes = new Uint8Array(await file.arrayBuffer());
	try {
		// displayCopies decodes (HEIC and raw too) and refuses, in the learner's words, what it cannot show (damaged, GIF, unknown)
		const copies = await displayCopies(bytes, { limits: { maxBytes: limit } });
		const type = detectFileType(bytes);
		// too small to measure, or damaged data a lenient decode turned into grey: refused now, not graded later
		const pixels = await framePixelsProblem(bytes, DEFAULT_LIMITS.maxPixels, type);
		if (pixels) return { problem: pixels };
		return { name, index, file, kind: type.kind as CheckedFrame['kind'], label: type.label, large: copies.large.data, thumb: copies.thumbnail.data };
	} catch (error) {
		if (!(error instanceof FrameReadError)) throw error;
		return { problem: error.message };
	}
}

/** Writes every file of the attempt; on any failure removes what was written and rethrows. */
export async function writeFrames(attemptId: string, frames: readonly CheckedFrame[]): Promise<StoredFrame[]> {
	const store = fileStore();
	const written: string[] = [];
	try {
		const stored: StoredFrame[] = [];
		for (const f of frames) {
			const keys = frameKeys(attemptId, f.index, f.kind, f.label);
			for (const [key, data] of [
				[keys.originalKey, () => f.file.arrayBuffer().then((b) => new Uint8Array(b))],
				[keys.largeKey, () => f.large],
				[keys.thumbKey, () => f.thumb]
			] as const) {
				await store.put(key, await data());
				written.push(key);
			}
			stored.push({ name: f.name, ...keys, mime: mimeFor(f.kind, f.label), bytes: f.file.size });
		}
		return stored;
	} catch (error) {
		await Promise.all(written.map((key) => store.delete(key).catch(() => undefined)));
		throw error;
	}
}

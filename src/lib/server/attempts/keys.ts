// Where an Attempt's files live in the file store: one folder per attempt, three files per frame.
import type { FileKind } from '../analysis/index';

const EXTENSIONS: Partial<Record<FileKind, string>> = { jpeg: 'jpg', png: 'png', webp: 'webp', tiff: 'tif', avif: 'avif' };

export const MIME_TYPES: Partial<Record<FileKind, string>> = {
	jpeg: 'image/jpeg',
	png: 'image/png',
	webp: 'image/webp',
	tiff: 'image/tiff',
	avif: 'image/avif'
};

export function attemptFolder(attemptId: string): string {
	return `attempts/${attemptId}`;
}

/** Frames are stored by position in the spec, so a frame's name never becomes a path. */
export function frameKeys(attemptId: string, index: number, kind: FileKind) {
	const base = `${attemptFolder(attemptId)}/${index}`;
	return {
		originalKey: `${base}-original.${EXTENSIONS[kind] ?? 'bin'}`,
		largeKey: `${base}-large.webp`,
		thumbKey: `${base}-thumb.webp`
	};
}

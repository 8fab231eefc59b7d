// Where an Attempt's files live in the file store: one folder per attempt, three files per frame.
import type { FileKind } from '../analysis/index';

const EXTENSIONS: Partial<Record<FileKind, string>> = { jpeg: 'jpg', png: 'png', webp: 'webp', tiff: 'tif', avif: 'avif', heic: 'heic', raw: 'raw' };

export const MIME_TYPES: Partial<Record<FileKind, string>> = {
	jpeg: 'image/jpeg',
	png: 'image/png',
	webp: 'image/webp',
	tiff: 'image/tiff',
	avif: 'image/avif',
	heic: 'image/heic',
	// raw formats have no registered media type; a download keeps the bytes as they came
	raw: 'application/octet-stream'
};

/** A raw file's own extension from its label, e.g. 'raw (DNG)' → 'dng'; else the kind's. */
export function extensionFor(kind: FileKind, label = ''): string {
	const format = kind === 'raw' ? label.match(/^raw \(([A-Z0-9]+)\)$/)?.[1] : undefined;
	return format ? format.toLowerCase() : (EXTENSIONS[kind] ?? 'bin');
}

/** The media type an original is served with (DNG has Adobe's; other raw formats none). */
export function mimeFor(kind: FileKind, label = ''): string {
	return kind === 'raw' && label === 'raw (DNG)' ? 'image/x-adobe-dng' : (MIME_TYPES[kind] ?? 'application/octet-stream');
}

export function attemptFolder(attemptId: string): string {
	return `attempts/${attemptId}`;
}

/** Frames are stored by position in the spec, so a frame's name never becomes a path. */
export function frameKeys(attemptId: string, index: number, kind: FileKind, label?: string) {
	const base = `${attemptFolder(attemptId)}/${index}`;
	return {
		originalKey: `${base}-original.${extensionFor(kind, label)}`,
		largeKey: `${base}-large.webp`,
		thumbKey: `${base}-thumb.webp`
	};
}

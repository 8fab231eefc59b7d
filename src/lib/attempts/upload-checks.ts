// Checks a browser can make before sending frames (the server checks again, by the file's bytes), and per-file progress.

// raw formats by the names cameras give them (browsers give most of them no media type)
const RAW_EXTENSIONS = ['dng', 'nef', 'nrw', 'cr2', 'cr3', 'arw', 'srf', 'sr2', 'raf', 'rw2', 'orf', 'pef', 'srw', 'rwl', '3fr', 'iiq'];

/** What the file picker offers: photos a camera or phone writes, HEIC and raw included. */
export const ACCEPT = [
	'image/jpeg,image/png,image/webp,image/tiff,image/avif,image/heic,image/heif',
	'.jpg,.jpeg,.png,.webp,.tif,.tiff,.avif,.heic,.heif',
	RAW_EXTENSIONS.map((e) => `.${e}`).join(',')
].join(',');

const RAW_NAME = new RegExp(`\\.(${RAW_EXTENSIONS.join('|')})$`, 'i');

/** Whether a file's name is one a camera gives its raw files. */
export function isRawFileName(name: string): boolean {
	return RAW_NAME.test(name);
}

const MEASURABLE = new RegExp(`\\.(jpe?g|png|webp|tiff?|avif|heic|heif|${RAW_EXTENSIONS.join('|')})$`, 'i');
const MEASURABLE_TYPES = new Set(['image/jpeg', 'image/png', 'image/webp', 'image/tiff', 'image/avif', 'image/heic', 'image/heif', 'image/x-adobe-dng']);

export interface ChosenFile {
	name: string;
	type: string;
	size: number;
}

const MB = 1024 * 1024;

export function formatMegabytes(bytes: number): string {
	if (bytes < MB) return `${Math.max(1, Math.round(bytes / 1024))} KB`;
	return `${(bytes / MB).toFixed(bytes < 10 * MB ? 1 : 0)} MB`;
}

/** A plain reason this file will not do, or null. */
export function checkChosenFile(file: ChosenFile, maxBytes: number): string | null {
	if (file.size === 0) return 'This file is empty. Please choose the photo again.';
	if (!MEASURABLE_TYPES.has(file.type) && !MEASURABLE.test(file.name)) {
		return 'This is not a photo we can read. Upload a JPEG, HEIC or raw file (DNG and the raw formats of common cameras) straight from the camera or phone, or a PNG, WebP, TIFF or AVIF from your editor.';
	}
	if (file.size > maxBytes) return tooLargeMessage(file.size, maxBytes, file.name);
	return null;
}

/**
 * Why a file over the limit is refused and what to send instead, in the same words wherever it is caught. Raw files of
 * high-resolution cameras often pass the limit, so their advice names the JPEG the camera can write beside them; both
 * frames of a pair must then be JPEGs made the same way, or the pair no longer compares.
 */
export function tooLargeMessage(size: number | null, maxBytes: number, name = '', raw = isRawFileName(name)): string {
	const kind = raw ? 'raw file' : 'file';
	const sizes = size === null ? `This ${kind} is larger than the limit of ${formatMegabytes(maxBytes)}.` : `This ${kind} is ${formatMegabytes(size)}; the limit is ${formatMegabytes(maxBytes)}.`;
	if (raw) {
		return `${sizes} Raw files from high-resolution cameras are often larger. Send the JPEG your camera writes beside the raw file (RAW+JPEG), or export a full-size JPEG without edits, the same way for every frame of the pair.`;
	}
	return `${sizes} Export a JPEG at full size and normal quality, which stays well under it.`;
}

/** The frames still without a file, as one message, or null when all are there. */
export function missingFramesMessage(frames: readonly string[], chosen: Readonly<Record<string, unknown>>): string | null {
	const missing = frames.filter((f) => !chosen[f]);
	if (missing.length === 0) return null;
	const quoted = missing.map((f) => `“${f}”`);
	const list = quoted.length === 1 ? quoted[0] : `${quoted.slice(0, -1).join(', ')} and ${quoted.at(-1)}`;
	return `Add the ${list} frame${missing.length === 1 ? '' : 's'} before sending.`;
}

/**
 * How far each file is, 0–1, from the bytes of one multipart body sent so far. The body carries the files
 * in order, each after a small part header (`overhead` bytes before each file, `lead` before the first).
 */
export function progressPerFile(sizes: readonly number[], loaded: number, lead = 0, overhead = 200): number[] {
	let start = lead;
	return sizes.map((size) => {
		start += overhead;
		const done = size === 0 ? (loaded >= start ? 1 : 0) : Math.min(1, Math.max(0, (loaded - start) / size));
		start += size;
		return done;
	});
}

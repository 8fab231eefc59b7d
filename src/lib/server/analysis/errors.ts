// Typed errors for frames we cannot read, each with a message written for the person who uploaded it.
import { tooLargeMessage } from '../../attempts/upload-checks';

export type FrameErrorCode =
	| 'empty'
	| 'too-large'
	| 'unsupported-type'
	| 'too-many-pixels'
	| 'malformed'
	| 'not-decodable'
	| 'too-small'
	| 'invalid-region';

/** The only error readFrame and displayCopies reject with; `message` can be shown to a learner as is. */
export class FrameReadError extends Error {
	readonly code: FrameErrorCode;

	constructor(code: FrameErrorCode, message: string, options?: { cause?: unknown }) {
		super(message, options);
		this.name = 'FrameReadError';
		this.code = code;
	}
}

export function isFrameReadError(value: unknown): value is FrameReadError {
	return value instanceof FrameReadError;
}


/** `raw`: the bytes are a raw file's, whatever its name says. */
export function tooLarge(size: number, maxBytes: number, raw = false): FrameReadError {
	return new FrameReadError('too-large', tooLargeMessage(size, maxBytes, '', raw));
}

export function tooManyPixels(width: number | null, height: number | null, maxPixels: number): FrameReadError {
	const declared = width && height ? `${width} × ${height} pixels` : 'more pixels than we accept';
	return new FrameReadError(
		'too-many-pixels',
		`This file declares ${declared}; the limit is ${Math.round(maxPixels / 1e6)} megapixels. Export a smaller JPEG.`
	);
}

/** Wraps whatever sharp or exifr threw into a message a learner can act on. */
export function malformed(cause: unknown, what = 'image'): FrameReadError {
	return new FrameReadError(
		'malformed',
		`This ${what} file looks damaged or incomplete (perhaps the upload was cut short), so it cannot be measured. Please export it again and re-upload.`,
		{ cause }
	);
}

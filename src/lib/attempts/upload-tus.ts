// Browser only: sends one file by resumable upload (tus), in parts of UPLOAD_PART_BYTES; a dropped connection is retried
// and resumes from the last part the server holds, and sending again after a failure resumes too. Frames of an attempt
// and lesson clips' videos go this way (the metadata says which).
import { Upload, type DetailedError } from 'tus-js-client';
import { UPLOAD_PART_BYTES } from './upload-parts';

export const UPLOAD_ENDPOINT = '/api/v1/uploads';

export type FrameSendResult = { ok: true } | { ok: false; reason: 'network' | 'refused' | 'cancelled'; status?: number; message?: string };

export interface FrameSender {
	/** Starts or resumes; settles when the frame is all on the server, or the upload gave up. */
	send(onProgress: (fraction: number) => void): Promise<FrameSendResult>;
	/** Stops and asks the server to forget what it has of this frame. */
	cancel(): Promise<void>;
}

/** The server's message (a JSON body with `message`), when it refused the upload. */
function refusalOf(error: Error | DetailedError): { status?: number; message?: string } {
	const response = (error as DetailedError).originalResponse;
	if (!response) return {};
	const status = response.getStatus();
	try {
		const body = JSON.parse(response.getBody()) as { message?: unknown };
		return { status, message: typeof body.message === 'string' ? body.message : undefined };
	} catch {
		return { status };
	}
}

export function frameSender(file: File, metadata: { assignment: string; frame: string; submissionKey: string }): FrameSender {
	return resumableSender(file, metadata);
}

/** A lesson clip's video, for a clip the author has just added (its id). */
export function clipSender(file: File, clipId: string): FrameSender {
	return resumableSender(file, { kind: 'clip', clip: clipId });
}

function resumableSender(file: File, metadata: Record<string, string>): FrameSender {
	let upload: Upload | null = null;
	let cancelled = false;
	let settle: ((result: FrameSendResult) => void) | null = null;
	return {
		send(onProgress) {
			cancelled = false;
			return new Promise<FrameSendResult>((resolve) => {
				settle = resolve;
				// the same Upload again: it knows its URL and asks the server (HEAD) where to resume
				upload ??= new Upload(file, {
					endpoint: UPLOAD_ENDPOINT,
					chunkSize: UPLOAD_PART_BYTES,
					// a phone losing signal: try again at once, then after 1, 3, 5 and 10 s
					retryDelays: [0, 1000, 3000, 5000, 10000],
					metadata: { ...metadata, filename: file.name, filetype: file.type },
					// resuming is for this page's own uploads: a new page makes a new submission
					storeFingerprintForResuming: false,
					onProgress: (sent, total) => onProgress(total > 0 ? sent / total : 0),
					onSuccess: () => settle?.({ ok: true }),
					onError: (error) => {
						if (cancelled) return settle?.({ ok: false, reason: 'cancelled' });
						const refused = refusalOf(error);
						const clientError = refused.status !== undefined && refused.status >= 400 && refused.status < 500;
						settle?.(clientError ? { ok: false, reason: 'refused', ...refused } : { ok: false, reason: 'network' });
					}
				});
				upload.start();
			});
		},
		async cancel() {
			cancelled = true;
			const current = upload;
			upload = null;
			settle?.({ ok: false, reason: 'cancelled' });
			await current?.abort(true).catch(() => undefined);
		}
	};
}

// Reads a multipart upload as a stream: text fields into memory (small, bounded), each file straight to a temporary
// file on disk, so a request of several large frames costs no more memory than one chunk of it.
import { randomBytes } from 'node:crypto';
import { createWriteStream, openAsBlob } from 'node:fs';
import { mkdir, rm } from 'node:fs/promises';
import { join } from 'node:path';
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import type { ReadableStream as NodeWebStream } from 'node:stream/web';
import busboy from 'busboy';
import { uploadDir } from './uploads/folder';
import { tooLargeMessage } from '../../attempts/upload-checks';

export interface MultipartLimits {
	/** bytes per file */
	fileBytes: number;
	/** file parts per request */
	files: number;
	/** text fields per request, and bytes per field */
	fields: number;
	fieldBytes: number;
}

export type MultipartResult =
	| { ok: true; data: FormData; cleanup: () => Promise<void> }
	| { ok: false; reason: 'too-large' | 'too-many-files' | 'bad-request'; message: string };

export async function readMultipartToDisk(request: Request, limits: MultipartLimits): Promise<MultipartResult> {
	const type = request.headers.get('content-type') ?? '';
	if (!type.toLowerCase().startsWith('multipart/form-data') || !request.body) {
		return { ok: false, reason: 'bad-request', message: 'Send the frames as a multipart form (the upload page does this).' };
	}
	const folder = join(uploadDir(), `multipart-${randomBytes(12).toString('hex')}`);
	const cleanup = () => rm(folder, { recursive: true, force: true });
	await mkdir(folder, { recursive: true });

	let parser: busboy.Busboy;
	try {
		parser = busboy({ headers: { 'content-type': type }, // busboy calls a file that reaches `fileSize` bytes truncated: one byte over the limit is the first refused
		limits: { fileSize: Math.floor(limits.fileBytes) + 1, files: limits.files, fields: limits.fields, fieldSize: limits.fieldBytes, parts: limits.files + limits.fields } });
	} catch {
		await cleanup();
		return { ok: false, reason: 'bad-request', message: 'Send the frames as a multipart form (the upload page does this).' };
	}

	const fields: [string, string][] = [];
	const files: { field: string; filename: string; mime: string; path: string }[] = [];
	const writes: Promise<void>[] = [];
	// a holder, not a `let`: it is set inside the parser's callbacks
	const state: { refused: Extract<MultipartResult, { ok: false }> | null } = { refused: null };
	const refuse = (r: Extract<MultipartResult, { ok: false }>) => {
		state.refused ??= r;
		request.body?.cancel().catch(() => undefined);
	};

	parser.on('field', (name, value, info) => {
		if (info.valueTruncated) refuse({ ok: false, reason: 'too-large', message: `The form field “${name.slice(0, 40)}” is longer than we accept.` });
		else fields.push([name, value]);
	});
	parser.on('file', (field, stream, info) => {
		if (state.refused) return stream.resume();
		const path = join(folder, String(files.length));
		files.push({ field, filename: info.filename ?? 'frame', mime: info.mimeType, path });
		stream.on('limit', () => {
			const frame = field.replace(/^frame:/, '').slice(0, 40);
			refuse({ ok: false, reason: 'too-large', message: `The “${frame}” frame: ${tooLargeMessage(null, limits.fileBytes, info.filename ?? '')}` });
		});
		writes.push(pipeline(stream, createWriteStream(path)));
	});
	parser.on('filesLimit', () =>
		refuse({ ok: false, reason: 'too-many-files', message: `The upload carried more than ${limits.files} files; an assignment has at most ${limits.files} frames. Nothing was stored.` })
	);
	parser.on('fieldsLimit', () => refuse({ ok: false, reason: 'bad-request', message: 'The upload carried more form fields than the upload form has.' }));

	try {
		await pipeline(Readable.fromWeb(request.body as unknown as NodeWebStream<Uint8Array>), parser);
		await Promise.all(writes);
	} catch (error) {
		await Promise.allSettled(writes);
		if (!state.refused) {
			await cleanup();
			// adapter-node's BODY_SIZE_LIMIT ends the stream with a 413
			if ((error as { status?: number } | null)?.status === 413) return { ok: false, reason: 'too-large', message: 'The upload is larger than we accept in one request. The upload page sends large frames in parts.' };
			return { ok: false, reason: 'bad-request', message: 'The upload was cut off or is not a readable form. Nothing was stored; please send it again.' };
		}
	}
	if (state.refused) {
		await cleanup();
		return state.refused;
	}

	const data = new FormData();
	for (const [name, value] of fields) data.append(name, value);
	for (const f of files) data.append(f.field, new File([await openAsBlob(f.path)], f.filename, { type: f.mime }));
	return { ok: true, data, cleanup };
}

// The resumable upload endpoint (tus protocol, @tus/server on the uploads in transit: this node's disk or the shared
// bucket, with a PostgreSQL lock per upload so two nodes never write one upload at once): who may start, resume or
// cancel an upload, and the limits: a known size up to the frame limit, only the assignment's own frames, one upload per frame. A lesson
// clip's video comes in by the same endpoint (Upload-Metadata `kind: clip`), checked by `clips/upload.ts`.
import { randomBytes } from 'node:crypto';
import { Server, type Upload } from '@tus/server';
import type { AuthUser } from '../../auth';
import { decideAccess, guardedAssignment } from '../../lessons/access';
import { planGateMessage } from '../../shoot-plans/read';
import { findAssignment } from '../assignment';
import { maxUploadBytes } from '../limits';
import { existingAttemptId } from '../submit';
import { clipLimits } from '../../clips/limits';
import { clipTooLarge, finishClipUpload, isClipUpload, mayResumeClipUpload, startClipUpload } from '../../clips/upload';
import { removeUploadFiles, uploadsInTransit, UPLOAD_TTL_MS, type UploadsInTransit } from './in-transit';
import { uploadLocker } from './pg-locker';
import { refusal, type Refusal } from './refusal';
import { readUploadMetadata } from './metadata';
import { deleteUploadRows, findUpload, markFinished, otherOpenSubmissions, recordUpload, uploadsOfSubmission } from './records';
import { tooLargeMessage } from '../../../attempts/upload-checks';

export const UPLOAD_PATH = '/api/v1/uploads';
export { UPLOAD_TTL_MS };
/** Submissions one learner may have in transit besides the one being started; older ones are dropped. */
const OPEN_SUBMISSIONS = 3;

type Uploader = Pick<AuthUser, 'id' | 'roles'>;
export { refusal };

function tooLarge(size: number, fileName?: string | null): Refusal {
	return refusal(413, 'too-large', tooLargeMessage(size, maxUploadBytes(), fileName ?? ''));
}

// the signed-in person of each request in flight (the tus hooks receive only the request)
const uploaders = new WeakMap<Request, Uploader>();

function uploaderOf(req: Request): Uploader {
	const user = uploaders.get(req);
	if (!user) throw refusal(401, 'sign-in', 'Sign in to upload your frames.');
	return user;
}

async function checkStart(req: Request, upload: Upload): Promise<{ metadata?: Upload['metadata'] }> {
	const user = uploaderOf(req);
	if (isClipUpload(upload.metadata)) {
		await startClipUpload(user, upload);
		return {};
	}
	const meta = readUploadMetadata(upload.metadata);
	if (!meta.ok) throw refusal(400, 'bad-request', meta.message);
	if (upload.size === undefined) throw refusal(400, 'bad-request', 'Say the size of the frame when the upload starts (Upload-Length).');
	const limit = maxUploadBytes();
	if (upload.size > limit) throw tooLarge(upload.size, upload.metadata?.filename);
	if (upload.size === 0) throw refusal(400, 'bad-request', 'This file is empty. Please choose the photo again.');

	const assignment = await findAssignment(meta.assignment);
	const access = await decideAccess(user, guardedAssignment(assignment));
	if (access === 'missing' || !assignment) throw refusal(404, 'not-found', 'There is no such assignment.');
	if (access !== 'open') throw refusal(403, 'not-enrolled', 'Enrol in this course to upload its assignments.');
	if (!assignment.spec) throw refusal(503, 'unavailable', 'This assignment’s criteria are being fixed, so uploads are closed for now. Please try again later.');
	const frames = assignment.spec.frames;
	if (!frames.includes(meta.frame)) {
		const names = frames.map((f) => `“${f}”`).join(', ');
		throw refusal(422, 'too-many-parts', `This assignment takes ${frames.length} frame${frames.length === 1 ? '' : 's'} (${names}); there is no “${meta.frame}” frame to upload.`);
	}
	if (await existingAttemptId(user.id, meta.submissionKey)) throw refusal(409, 'already-sent', 'These frames were already sent. Reload the page to see the attempt.');
	const gate = await planGateMessage(assignment.spec, user.id, assignment.id);
	if (gate) throw refusal(403, 'plan-needed', gate);

	// a learner who started and left several uploads keeps only the newest few in transit
	const others = await otherOpenSubmissions(user.id, meta.submissionKey);
	for (const key of others.slice(0, Math.max(0, others.length - OPEN_SUBMISSIONS))) await dropSubmission(user.id, key);

	const { replaced } = await recordUpload({ id: upload.id, userId: user.id, assignmentId: assignment.id, submissionKey: meta.submissionKey, frameName: meta.frame, size: upload.size });
	if (replaced) await removeUploadFiles(replaced);
	return {};
}

/** Forgets every upload of one submission: rows and bytes. */
export async function dropSubmission(userId: string, submissionKey: string): Promise<void> {
	const rows = await uploadsOfSubmission(userId, submissionKey);
	await deleteUploadRows(rows.map((r) => r.id));
	await Promise.all(rows.map((r) => removeUploadFiles(r.id)));
}

/** Resuming (HEAD, PATCH) and cancelling (DELETE) are for the upload's own learner; anyone else learns nothing. */
async function checkOwner(req: Request, id: string): Promise<void> {
	const user = uploaderOf(req);
	if (req.method === 'POST') return;
	const row = await findUpload(id);
	if (!row && (await mayResumeClipUpload(user, id))) return;
	if (!row || row.userId !== user.id) throw refusal(404, 'not-found', 'This upload is not (or no longer) here. Send the frame again.');
}

function createServer(uploads: UploadsInTransit): Server {
	const options: ConstructorParameters<typeof Server>[0] = {
		path: UPLOAD_PATH,
		relativeLocation: true,
		datastore: uploads.datastore,
		// one lock per upload across every node (the default lock holds only within this process)
		locker: uploadLocker(),
		// the larger of the two limits: each kind checks its own when the upload starts
		maxSize: () => Math.max(maxUploadBytes(), clipLimits().bytes),
		// same origin only: no CORS headers for anyone
		allowedOrigins: () => false,
		namingFunction: () => randomBytes(16).toString('hex'),
		onIncomingRequest: checkOwner,
		onUploadCreate: checkStart,
		async onUploadFinish(_req, upload) {
			if (isClipUpload(upload.metadata) && (await finishClipUpload(upload.id))) return {};
			await markFinished(upload.id);
			return {};
		},
		onResponseError(req, error) {
			if ('status_code' in error) {
				// tus checks the declared length against maxSize before our own check: answer in the same words
				if (error.status_code === 413 && !error.body.startsWith('{')) {
					const size = Number(req.headers.get('upload-length')) || Number.MAX_SAFE_INTEGER;
					const metadata = req.headers.get('upload-metadata') ?? '';
					return /(^|,)\s*kind\s/.test(metadata) ? clipTooLarge(size) : tooLarge(size, declaredFileName(metadata));
				}
				return undefined;
			}
			console.error('[uploads]', error.message);
			return refusal(500, 'upload-failed', 'The upload could not be stored just now. It resumes when you send again.');
		}
	};
	return new Server(options);
}

/** The `filename` pair of a raw Upload-Metadata header (tus: comma-separated `key base64value` pairs), or ''. */
function declaredFileName(header: string): string {
	const value = header
		.split(',')
		.map((pair) => pair.trim().split(' '))
		.find(([key]) => key === 'filename')?.[1];
	return value ? Buffer.from(value, 'base64').toString('utf8').slice(0, 200) : '';
}

let server: { for: UploadsInTransit; tus: Server } | undefined;

/**
 * A part's body that ends, instead of failing, where the connection was cut: tus then keeps every byte that arrived and
 * the learner's next HEAD resumes from there, not from the start of the part. The request limit's 413 still fails.
 */
function keepWhatArrives(body: ReadableStream<Uint8Array>): ReadableStream<Uint8Array> {
	const reader = body.getReader();
	return new ReadableStream<Uint8Array>({
		async pull(controller) {
			try {
				const { done, value } = await reader.read();
				if (done) controller.close();
				else controller.enqueue(value);
			} catch (error) {
				if ((error as { status?: number } | null)?.status === 413) controller.error(error);
				else controller.close();
			}
		},
		cancel: (reason) => reader.cancel(reason)
	});
}

/** tus answers its own protocol errors (a missing header, a wrong offset) in plain text: every API error here is JSON. */
async function asJsonError(response: Response): Promise<Response> {
	if (response.status < 400 || !response.body) return response;
	const text = await response.text();
	if (text.startsWith('{')) return new Response(text, { status: response.status, headers: withJsonType(response.headers) });
	const headers = withJsonType(response.headers);
	headers.delete('content-length');
	return new Response(JSON.stringify({ error: 'upload-protocol', message: text.trim() || 'The upload request could not be used.' }), { status: response.status, headers });
}

function withJsonType(headers: Headers): Headers {
	const copy = new Headers(headers);
	copy.set('content-type', 'application/json');
	return copy;
}

/** Answers one tus request (POST, HEAD, PATCH, DELETE) for a signed-in person. */
export async function handleUpload(incoming: Request, user: Uploader): Promise<Response> {
	const uploads = uploadsInTransit();
	if (server?.for !== uploads) server = { for: uploads, tus: createServer(uploads) };
	const request =
		incoming.method === 'PATCH' && incoming.body
			? new Request(incoming.url, { method: 'PATCH', headers: incoming.headers, body: keepWhatArrives(incoming.body), duplex: 'half' } as RequestInit)
			: incoming;
	uploaders.set(request, user);
	const response = await asJsonError(await server.tus.handleWeb(request));
	// a cancelled upload leaves no row behind (tus removed its bytes)
	if (request.method === 'DELETE' && response.status === 204) {
		const id = new URL(request.url).pathname.split('/').pop() ?? '';
		await deleteUploadRows([id]);
	}
	return response;
}

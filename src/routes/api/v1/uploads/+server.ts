// POST starts a resumable upload of one frame (tus creation): Upload-Length and Upload-Metadata (assignment, frame,
// submissionKey). DELETE ?submissionKey= cancels every frame of one submission, even one whose start was still on its way.
import { json } from '@sveltejs/kit';
import { checkApiAccess } from '$lib/server/guards';
import { dropSubmission, handleUpload } from '$lib/server/attempts/uploads/tus';
import { uploadsOfSubmission } from '$lib/server/attempts/uploads/records';
import { readUploadMetadata } from '$lib/server/attempts/uploads/metadata';
import type { RequestHandler } from './$types';

/** tus starts an upload with no body (or with the file's first bytes): a form or JSON here is a mistake. */
function formBodyRefused(request: Request): Response | null {
	const type = request.headers.get('content-type');
	if (!type || type.toLowerCase().startsWith('application/offset+octet-stream')) return null;
	void request.body?.cancel().catch(() => undefined);
	return json({ error: 'bad-request', message: 'This address takes frames by resumable upload (tus); the upload page does this.' }, { status: 400 });
}

export const POST: RequestHandler = async ({ locals, request }) => {
	const access = checkApiAccess(locals);
	if (!access.ok) return access.response;
	return formBodyRefused(request) ?? handleUpload(request, access.user);
};

export const DELETE: RequestHandler = async ({ locals, request, url }) => {
	const access = checkApiAccess(locals);
	if (!access.ok) return access.response;
	const refused = formBodyRefused(request);
	if (refused) return refused;
	// the key is checked as the upload's own metadata is
	const key = readUploadMetadata({ assignment: 'any', frame: 'any', submissionKey: url.searchParams.get('submissionKey') ?? '' });
	const rows = key.ok ? await uploadsOfSubmission(access.user.id, key.submissionKey) : [];
	if (!key.ok || rows.length === 0) return json({ error: 'not-found', message: 'No upload of yours has that submission key.' }, { status: 404 });
	await dropSubmission(access.user.id, key.submissionKey);
	return new Response(null, { status: 204 });
};

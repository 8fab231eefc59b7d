// POST starts a resumable upload of one frame (tus creation): Upload-Length and Upload-Metadata (assignment, frame, submissionKey).
import { json } from '@sveltejs/kit';
import { checkApiAccess } from '$lib/server/guards';
import { handleUpload } from '$lib/server/attempts/uploads/tus';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = async ({ locals, request }) => {
	const access = checkApiAccess(locals);
	if (!access.ok) return access.response;
	// tus starts an upload with no body (or with the file's first bytes): a form or JSON here is a mistake
	const type = request.headers.get('content-type');
	if (type && !type.toLowerCase().startsWith('application/offset+octet-stream')) {
		void request.body?.cancel().catch(() => undefined);
		return json({ error: 'bad-request', message: 'This address takes frames by resumable upload (tus); the upload page does this.' }, { status: 400 });
	}
	return handleUpload(request, access.user);
};

// POST starts a resumable upload of one frame (tus creation): Upload-Length and Upload-Metadata (assignment, frame, submissionKey).
import { checkApiAccess } from '$lib/server/guards';
import { handleUpload } from '$lib/server/attempts/uploads/tus';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = async ({ locals, request }) => {
	const access = checkApiAccess(locals);
	if (!access.ok) return access.response;
	return handleUpload(request, access.user);
};

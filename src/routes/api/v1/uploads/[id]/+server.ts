// One resumable upload (tus): HEAD says how much arrived, PATCH sends the next part, DELETE cancels. Only its own learner
// (a frame), or an author (a lesson clip's video).
import { json } from '@sveltejs/kit';
import { checkApiAccess } from '$lib/server/guards';
import { handleUpload } from '$lib/server/attempts/uploads/tus';
import { findUpload } from '$lib/server/attempts/uploads/records';
import { isUploadId } from '$lib/server/attempts/uploads/folder';
import { mayResumeClipUpload } from '$lib/server/clips/upload';
import type { RequestHandler } from './$types';

const tus: RequestHandler = async ({ locals, params, request }) => {
	const access = checkApiAccess(locals);
	if (!access.ok) return access.response;
	// someone else's upload and a missing one answer alike, before the protocol is even read
	const row = isUploadId(params.id) ? await findUpload(params.id) : null;
	const clipUpload = !row && isUploadId(params.id) && (await mayResumeClipUpload(access.user, params.id)) === true;
	if (!clipUpload && (!row || row.userId !== access.user.id)) {
		void request.body?.cancel().catch(() => undefined);
		return json({ error: 'not-found', message: 'This upload is not (or no longer) here. Send the frame again.' }, { status: 404 });
	}
	return handleUpload(request, access.user);
};

export const HEAD = tus;
export const PATCH = tus;
export const DELETE = tus;

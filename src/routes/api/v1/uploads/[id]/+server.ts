// One resumable upload (tus): HEAD says how much arrived, PATCH sends the next part, DELETE cancels. Only its own learner.
import { checkApiAccess } from '$lib/server/guards';
import { handleUpload } from '$lib/server/attempts/uploads/tus';
import type { RequestHandler } from './$types';

const tus: RequestHandler = async ({ locals, request }) => {
	const access = checkApiAccess(locals);
	if (!access.ok) return access.response;
	return handleUpload(request, access.user);
};

export const HEAD = tus;
export const PATCH = tus;
export const DELETE = tus;

// POST /api/v1/author/clips: adds a clip to a lesson (name, title, WebVTT captions); its video then follows by resumable upload.
import { json } from '@sveltejs/kit';
import { clipSchema } from '$lib/forms/clips';
import { checkApiAccess } from '$lib/server/guards';
import { addClip } from '$lib/server/clips/author';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = async ({ locals, request }) => {
	const access = checkApiAccess(locals, 'author');
	if (!access.ok) return access.response;
	const parsed = clipSchema.safeParse(await request.json().catch(() => null));
	if (!parsed.success) {
		const issue = parsed.error.issues[0];
		const field = typeof issue?.path[0] === 'string' ? issue.path[0] : null;
		return json({ error: 'bad-request', field, message: issue?.message ?? 'Send the lesson, name, title and captions.' }, { status: 400 });
	}
	const added = await addClip(access.user.id, parsed.data);
	if (!added.ok) return json({ error: added.status === 404 ? 'not-found' : 'name-taken', field: added.status === 409 ? 'name' : null, message: added.message }, { status: added.status });
	return json({ id: added.id }, { status: 201 });
};

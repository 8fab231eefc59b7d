// GET a clip's state while it is prepared (status, progress, error); DELETE removes it with its files. Authors only.
import { json } from '@sveltejs/kit';
import { checkApiAccess } from '$lib/server/guards';
import { clipState, deleteClip } from '$lib/server/clips/author';
import { isClipId } from '$lib/server/clips/keys';
import type { RequestHandler } from './$types';

const missing = () => json({ error: 'not-found', message: 'There is no such clip.' }, { status: 404 });

export const GET: RequestHandler = async ({ locals, params }) => {
	const access = checkApiAccess(locals, 'author');
	if (!access.ok) return access.response;
	const state = isClipId(params.id) ? await clipState(params.id) : null;
	return state ? json(state, { headers: { 'cache-control': 'no-store' } }) : missing();
};

export const DELETE: RequestHandler = async ({ locals, params }) => {
	const access = checkApiAccess(locals, 'author');
	if (!access.ok) return access.response;
	return isClipId(params.id) && (await deleteClip(params.id)) ? new Response(null, { status: 204 }) : missing();
};

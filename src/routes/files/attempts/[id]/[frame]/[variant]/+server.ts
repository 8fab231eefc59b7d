// A frame's original or display copy, for the learner who made the attempt, mentors and admins only.
import { readAttemptFile } from '$lib/server/attempts/files';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ locals, params }) => {
	const file = await readAttemptFile(locals.user, params.id, params.frame, params.variant);
	if (!file.ok) {
		return new Response(file.status === 401 ? 'Sign in to see this photo.' : 'Not found.', {
			status: file.status,
			headers: { 'content-type': 'text/plain; charset=utf-8', 'cache-control': 'no-store' }
		});
	}
	const original = params.variant === 'original';
	// streamed from the store as the client reads it: a 40 MB original is never held whole in memory
	return new Response(file.file.body, {
		headers: {
			'content-type': file.type,
			'content-length': String(file.file.size),
			// private: a shared cache must never hand one learner's photo to another person
			'cache-control': 'private, max-age=3600',
			'content-disposition': `${original ? 'attachment' : 'inline'}; filename="${file.filename}"`
		}
	});
};

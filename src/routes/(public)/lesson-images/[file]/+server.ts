// GET /lesson-images/<id>.webp: a lesson image (public, like the lessons that show it; ids are unguessable).
import { error } from '@sveltejs/kit';
import { readLessonImage } from '$lib/server/authoring/images';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ params }) => {
	const bytes = await readLessonImage(params.file);
	if (!bytes) error(404, { message: 'There is no such image.' });
	return new Response(new Uint8Array(bytes), {
		headers: {
			'content-type': 'image/webp',
			'content-length': String(bytes.byteLength),
			// an id is never reused for other bytes
			'cache-control': 'public, max-age=31536000, immutable'
		}
	});
};

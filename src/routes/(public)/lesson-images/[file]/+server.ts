// GET /lesson-images/<id>.webp: a lesson image (public, like the lessons that show it; ids are unguessable).
import { error } from '@sveltejs/kit';
import { readLessonImage } from '$lib/server/authoring/images';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ params }) => {
	const image = await readLessonImage(params.file);
	if (!image) error(404, { message: 'There is no such image.' });
	return new Response(image.body, {
		headers: {
			'content-type': 'image/webp',
			'content-length': String(image.size),
			// an id is never reused for other bytes
			'cache-control': 'public, max-age=31536000, immutable'
		}
	});
};

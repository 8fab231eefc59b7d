// Guard for the learning area: signed-in people only; a free-preview lesson is open to everyone.
import { lessonAccess } from '$lib/server/courses-access';
import { requireUser } from '$lib/server/guards';
import type { LayoutServerLoad } from './$types';

export const load: LayoutServerLoad = async (event) => {
	const { course, lesson } = event.params as { course?: string; lesson?: string };
	if (!event.locals.user && course && lesson) {
		// a missing lesson falls through to the page's own 404
		if ((await lessonAccess(course, lesson)) !== 'members') return {};
	}
	requireUser(event);
	return {};
};

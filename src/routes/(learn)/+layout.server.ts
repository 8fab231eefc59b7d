// Guard for the learning area: signed-in people only; a free-preview lesson is open to everyone.
import { decideAccess, guardedLesson } from '$lib/server/lessons/access';
import { requireUser } from '$lib/server/guards';
import type { LayoutServerLoad } from './$types';

// the lesson page applies the same rule itself, from the lesson it loads anyway: no second look-up for it here
const LESSON_PAGE = '/(learn)/courses/[course]/[lesson]';

export const load: LayoutServerLoad = async (event) => {
	const { course, lesson } = event.params as { course?: string; lesson?: string };
	if (!event.locals.user && event.route.id === LESSON_PAGE) return {};
	if (!event.locals.user && course && lesson) {
		// an open lesson needs no sign-in; a missing one falls through to the page's own 404
		const access = await decideAccess(null, await guardedLesson(course, lesson));
		if (access === 'open' || access === 'missing') return {};
	}
	requireUser(event);
	return {};
};

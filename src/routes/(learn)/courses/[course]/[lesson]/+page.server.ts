// A lesson: its page (server/lessons/page.ts decides access and gathers it) and "I've finished this lesson".
import { requireUser } from '$lib/server/guards';
import { loadLessonPage, markLessonDone } from '$lib/server/lessons/page';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ params, locals, url }) => loadLessonPage(locals.user, url, params.course, params.lesson);

export const actions = {
	/** "I've finished this lesson" (done=yes) and its undo (done=no). */
	complete: async (event) => {
		const user = requireUser(event);
		const done = (await event.request.formData()).get('done') !== 'no';
		await markLessonDone(user, event.url, event.params.course, event.params.lesson, done);
		return { completed: done };
	}
} satisfies Actions;

// The verdict page: the learner's own attempt (mentors and admins may open it too); the critique once it is sent.
import { error } from '@sveltejs/kit';
import { requireUser } from '$lib/server/guards';
import { loadAttemptView } from '$lib/server/attempts/view';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireUser(event);
	const attempt = await loadAttemptView(user, event.params.id);
	// someone else's attempt looks exactly like a missing one
	if (!attempt) error(404, { message: 'There is no such attempt.' });
	return { attempt };
};

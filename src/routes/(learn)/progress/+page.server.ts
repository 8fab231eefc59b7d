// The learner's progress: how close each graded attempt came to its targets, over time.
import { requireUser } from '$lib/server/guards';
import { loadProgress } from '$lib/server/attempts/progress';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireUser(event);
	return { points: await loadProgress(user.id) };
};

// Learning records (xAPI): where statements go, the backlog with its last error, the last statements sent, "retry now".
import { requireRole } from '$lib/server/guards';
import { learningRecordsOverview, retryNow } from '$lib/server/learning-records/admin';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'admin');
	return { overview: await learningRecordsOverview() };
};

export const actions = {
	retry: async (event) => {
		requireRole(event, 'admin');
		const back = await retryNow();
		const text = back
			? `${back} statement${back === 1 ? '' : 's'} the LRS refused went back into the backlog; sending now.`
			: 'Sending the backlog now.';
		return { retry: { ok: true, text } };
	}
} satisfies Actions;

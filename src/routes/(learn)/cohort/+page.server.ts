// The learner's cohort schedule: each cohort they belong to, its mentor, and each Assignment's due date and state.
import { requireUser } from '$lib/server/guards';
import { learnerCohorts } from '$lib/server/cohorts/schedule';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireUser(event);
	const cohorts = await learnerCohorts(user.id);
	return {
		cohorts: cohorts.map((c) => ({ ...c, items: c.items.map((i) => ({ ...i, dueAt: i.dueAt.toISOString() })) }))
	};
};

// The review queue: the first page is rendered on the server; the table then filters, sorts and pages through the JSON API.
import { requireRole } from '$lib/server/guards';
import { readQueueParams } from '$lib/attempts/queue-params';
import { fetchReviewQueue, queueFilterOptions } from '$lib/server/review/queue-query';
import { countWaiting } from '$lib/server/review/waiting';
import { overdueInCohort } from '$lib/server/cohorts/schedule';
import { listWaitingPlans } from '$lib/server/shoot-plans';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const mentor = requireRole(event, 'mentor');
	const params = { ...readQueueParams(event.url.searchParams), cursor: '' };
	const [page, options, waiting, plans, overdue] = await Promise.all([
		fetchReviewQueue(params, mentor.id),
		queueFilterOptions(),
		countWaiting(),
		listWaitingPlans(mentor.id),
		params.cohort ? overdueInCohort(params.cohort) : []
	]);
	const { cursor: _cursor, ...query } = params;
	return { query, attempts: page.ok ? page.rows : [], nextCursor: page.ok ? page.nextCursor : null, overdue, options, waiting, plansWaiting: plans.length };
};

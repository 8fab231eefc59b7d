// GET the mentor's review queue as JSON: filters (status, course, assignment, cohort, age), sort and cursor pages.
import { json } from '@sveltejs/kit';
import { checkApiAccess } from '$lib/server/guards';
import { readQueueParams } from '$lib/attempts/queue-params';
import { fetchReviewQueue } from '$lib/server/review/queue-query';
import { overdueInCohort } from '$lib/server/cohorts/schedule';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ locals, url }) => {
	const access = checkApiAccess(locals, 'mentor');
	if (!access.ok) return access.response;
	const params = readQueueParams(url.searchParams);
	const page = await fetchReviewQueue(params, access.user.id);
	if (!page.ok) return json({ error: 'bad-cursor', message: page.message }, { status: 400 });
	const { cursor: _cursor, ...query } = params;
	// with a cohort chosen, who has missed a due date (no Attempt at all) is listed beside the queue
	const overdue = params.cohort ? await overdueInCohort(params.cohort) : [];
	return json({ query, attempts: page.rows, nextCursor: page.nextCursor, overdue }, { headers: { 'cache-control': 'no-store' } });
};

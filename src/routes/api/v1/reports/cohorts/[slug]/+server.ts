// GET a cohort's report as CSV (mentors and admins): each member and due date, on time or not, verdicts, time to critique.
import { json } from '@sveltejs/kit';
import { checkApiAccess } from '$lib/server/guards';
import { cohortReportCsv } from '$lib/server/field-days/report';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ locals, params }) => {
	const access = checkApiAccess(locals, 'mentor');
	if (!access.ok) return access.response;
	const csv = await cohortReportCsv(params.slug);
	if (csv === null) return json({ error: 'not-found', message: 'There is no such cohort.' }, { status: 404 });
	return new Response(csv, { headers: { 'content-type': 'text/csv; charset=utf-8', 'content-disposition': `attachment; filename="cohort-${params.slug}.csv"`, 'cache-control': 'no-store' } });
};

// GET a field day's report as CSV (mentors and admins): attendance, the briefing, the day's Attempts, verdicts, time to critique.
import { json } from '@sveltejs/kit';
import { checkApiAccess } from '$lib/server/guards';
import { fieldDayReportCsv } from '$lib/server/field-days/report';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ locals, params }) => {
	const access = checkApiAccess(locals, 'mentor');
	if (!access.ok) return access.response;
	const csv = await fieldDayReportCsv(params.slug);
	if (csv === null) return json({ error: 'not-found', message: 'There is no such field day.' }, { status: 404 });
	return new Response(csv, { headers: { 'content-type': 'text/csv; charset=utf-8', 'content-disposition': `attachment; filename="field-day-${params.slug}.csv"`, 'cache-control': 'no-store' } });
};

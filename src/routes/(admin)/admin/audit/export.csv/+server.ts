// GET /admin/audit/export.csv: the audit log with the page's filters, as a CSV download.
import { requireRole } from '$lib/server/guards';
import { auditCsv, readAuditQuery } from '$lib/server/audit';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async (event) => {
	requireRole(event, 'admin');
	const csv = await auditCsv(readAuditQuery(event.url.searchParams));
	const day = new Date().toISOString().slice(0, 10);
	return new Response(csv, {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="stopwise-audit-${day}.csv"`,
			'cache-control': 'no-store'
		}
	});
};

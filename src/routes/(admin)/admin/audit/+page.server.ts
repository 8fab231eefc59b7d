// The audit log: every consequential action (who, when, what, why), filtered by URL params, a page at a time.
import { requireRole } from '$lib/server/guards';
import { AUDIT_ACTION_LABELS, listAudit, readAuditQuery } from '$lib/server/audit';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'admin');
	const query = readAuditQuery(event.url.searchParams);
	return { query, labels: AUDIT_ACTION_LABELS, ...(await listAudit(query)) };
};

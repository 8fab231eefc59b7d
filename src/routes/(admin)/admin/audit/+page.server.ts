// The role log: every change of roles, newest first.
import { z } from 'zod';
import { requireRole } from '$lib/server/guards';
import { listRoleAudit } from '$lib/server/people';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'admin');
	const page = z.coerce.number().int().min(1).max(100_000).catch(1).parse(event.url.searchParams.get('page') ?? 1);
	return { page, ...(await listRoleAudit(page)) };
};

// GET /api/v1/admin/people?q=&sort=&dir=&page=: the people list as JSON, for admins.
import { json } from '@sveltejs/kit';
import { checkApiAccess } from '$lib/server/guards';
import { listPeople, pageSize, readPeopleQuery } from '$lib/server/people';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ locals, url }) => {
	const access = checkApiAccess(locals, 'admin');
	if (!access.ok) return access.response;
	const query = readPeopleQuery(url.searchParams);
	const { people, total, pages } = await listPeople(query);
	return json({ query, pageSize, total, pages, people });
};

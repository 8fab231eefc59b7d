// GET /api/v1/me: the signed-in person (401 when signed out).
import { json } from '@sveltejs/kit';
import { checkApiAccess } from '$lib/server/guards';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = ({ locals }) => {
	const access = checkApiAccess(locals);
	if (!access.ok) return access.response;
	const { id, name, email, emailVerified, roles } = access.user;
	return json({ id, name, email, emailVerified, roles });
};

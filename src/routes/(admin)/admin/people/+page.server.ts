// People table (search, sort, pages from URL params) and role changes, each one logged.
import { fail } from '@sveltejs/kit';
import { startSession } from '$lib/server/auth';
import { requireRole } from '$lib/server/guards';
import { listPeople, readPeopleQuery, setRoles, setRolesSchema } from '$lib/server/people';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'admin');
	const query = readPeopleQuery(event.url.searchParams);
	return { query, ...(await listPeople(query)), me: event.locals.user!.id };
};

export const actions = {
	setRoles: async (event) => {
		const admin = requireRole(event, 'admin');
		const data = await event.request.formData();
		const parsed = setRolesSchema.safeParse({ userId: data.get('userId'), roles: data.getAll('roles') });
		const userId = String(data.get('userId') ?? '');
		if (!parsed.success) {
			return fail(400, { roles: { userId, ok: false, text: parsed.error.issues[0]?.message ?? 'Those roles are not valid.' } });
		}
		const result = await setRoles(admin, parsed.data.userId, parsed.data.roles);
		if (!result.ok) return fail(400, { roles: { userId, ok: false, text: result.message } });
		// the change ended the person's sessions; when it was the admin's own, this browser gets a new one
		if (result.selfChanged) await startSession(event.cookies, admin.id);
		const text = result.changed ? `${result.name} now has: ${result.roles.join(', ')}.` : `${result.name}'s roles are unchanged.`;
		return { roles: { userId, ok: true, text } };
	}
} satisfies Actions;

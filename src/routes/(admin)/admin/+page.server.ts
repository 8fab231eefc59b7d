// /admin itself has nothing to show: send admins to the people table.
import { redirect } from '@sveltejs/kit';
import { requireRole } from '$lib/server/guards';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = (event) => {
	requireRole(event, 'admin');
	redirect(303, '/admin/people');
};

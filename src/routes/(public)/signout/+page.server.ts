// Sign out (POST only): ends this browser's session.
import { redirect } from '@sveltejs/kit';
import { endSession } from '$lib/server/auth';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ locals }) => {
	if (!locals.user) redirect(303, '/');
	return {};
};

export const actions = {
	default: async ({ cookies, locals }) => {
		await endSession(cookies, locals.session?.id);
		redirect(303, '/signin?notice=signed-out');
	}
} satisfies Actions;

// Cohorts for authors and admins: every cohort with its course, mentor and members, and the form to make another.
import { fail, redirect } from '@sveltejs/kit';
import { setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { requireRole } from '$lib/server/guards';
import { cohortSchema } from '$lib/forms/cohorts';
import { cohortFormOptions, createCohort, listCohorts } from '$lib/server/cohorts/manage';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'author');
	const [cohorts, options] = await Promise.all([listCohorts(), cohortFormOptions()]);
	const form = await superValidate({ courseSlug: options.courses[0]?.slug ?? '' }, zod4(cohortSchema), { id: 'new-cohort', errors: false });
	return { cohorts, options, form };
};

export const actions = {
	create: async (event) => {
		const user = requireRole(event, 'author');
		const form = await superValidate(event.request, zod4(cohortSchema), { id: 'new-cohort' });
		if (!form.valid) return fail(400, { form });
		const made = await createCohort(user, form.data);
		if (!made.ok) return made.field ? setError(form, made.field, made.message) : setError(form, made.message);
		redirect(303, `/author/cohorts/${made.id}?notice=created`);
	}
} satisfies Actions;

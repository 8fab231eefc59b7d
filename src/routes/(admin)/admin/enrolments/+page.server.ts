// Enrolment list (filters from URL params); grant access by hand, revoke or restore it.
import { fail } from '@sveltejs/kit';
import { message, setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { requireRole } from '$lib/server/guards';
import { grantEnrolment, listEnrolments, readEnrolmentsQuery, setEnrolmentStatus } from '$lib/server/payments/admin-enrolments';
import { grantSchema } from '$lib/forms/enrolments';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'admin');
	const query = readEnrolmentsQuery(event.url.searchParams);
	const listed = await listEnrolments(query);
	const grantForm = await superValidate({ course: listed.courses[0]?.slug ?? '' }, zod4(grantSchema), { id: 'grant', errors: false });
	return { query, ...listed, grantForm };
};

export const actions = {
	grant: async (event) => {
		const admin = requireRole(event, 'admin');
		const form = await superValidate(event.request, zod4(grantSchema), { id: 'grant' });
		if (!form.valid) return fail(400, { form });
		const result = await grantEnrolment(admin, form.data.email, form.data.course, form.data.reason);
		if (!result.ok) return setError(form, result.field, result.message);
		return message(form, result.message);
	},
	setStatus: async (event) => {
		const admin = requireRole(event, 'admin');
		const data = await event.request.formData();
		const id = Number(data.get('enrolmentId'));
		const status = data.get('status');
		if (!Number.isSafeInteger(id) || id < 1 || (status !== 'active' && status !== 'revoked')) {
			return fail(400, { change: { id, ok: false, text: 'That change is not valid.' } });
		}
		const result = await setEnrolmentStatus(admin, id, status, String(data.get('reason') ?? '').trim().slice(0, 500));
		if (!result.ok) return fail(400, { change: { id, ok: false, text: result.message } });
		return { change: { id, ok: true, text: result.message } };
	}
} satisfies Actions;

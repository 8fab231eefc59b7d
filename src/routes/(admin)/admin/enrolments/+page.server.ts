// Enrolment list (filters from URL params); grant access by hand, revoke or restore it.
import { fail } from '@sveltejs/kit';
import { message, setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { requireRole } from '$lib/server/guards';
import { grantEnrolment, listEnrolments, readEnrolmentsQuery, setEnrolmentStatus } from '$lib/server/payments/admin-enrolments';
import { enrolmentStatusSchema, grantSchema, type EnrolmentStatusForm } from '$lib/forms/enrolments';
import type { Notice } from '$lib/forms/review';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'admin');
	const query = readEnrolmentsQuery(event.url.searchParams);
	const listed = await listEnrolments(query);
	const [grantForm, statusForms] = await Promise.all([
		superValidate({ course: listed.courses[0]?.slug ?? '' }, zod4(grantSchema), { id: 'grant', errors: false }),
		Promise.all(listed.enrolments.map((e) => superValidate<EnrolmentStatusForm, Notice>({ enrolmentId: e.id }, zod4(enrolmentStatusSchema), { id: statusFormId(e.id), errors: false })))
	]);
	return { query, ...listed, grantForm, statusForms: Object.fromEntries(listed.enrolments.map((e, i) => [e.id, statusForms[i]])) };
};

/** Each row has its own revoke/restore form, told apart by the enrolment's id. */
const statusFormId = (enrolmentId: number) => `enrolment-${enrolmentId}`;

export const actions = {
	grant: async (event) => {
		const admin = requireRole(event, 'admin');
		const form = await superValidate(event.request, zod4(grantSchema), { id: 'grant' });
		if (!form.valid) return fail(400, { form });
		const result = await grantEnrolment(admin, form.data.email, form.data.course, form.data.reason);
		if (!result.ok) return setError(form, result.field, result.message);
		return message(form, result.message);
	},
	/** Revoke or restore, as the row's button says (its name is `status`). */
	setStatus: async (event) => {
		const admin = requireRole(event, 'admin');
		const form = await superValidate<EnrolmentStatusForm, Notice>(event.request, zod4(enrolmentStatusSchema));
		if (!form.valid) return fail(400, { form });
		const { enrolmentId, status, reason } = form.data;
		const result = await setEnrolmentStatus(admin, enrolmentId, status, reason);
		if (!result.ok) return message(form, { text: result.message, ok: false }, { status: 400 });
		return message(form, { text: result.message, ok: true });
	}
} satisfies Actions;

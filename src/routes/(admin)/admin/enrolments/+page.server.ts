// Enrolment list (filters from URL params); grant access by hand, revoke or restore it.
import { fail } from '@sveltejs/kit';
import { requireRole } from '$lib/server/guards';
import { grantEnrolment, grantSchema, listEnrolments, readEnrolmentsQuery, setEnrolmentStatus } from '$lib/server/payments/admin-enrolments';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'admin');
	const query = readEnrolmentsQuery(event.url.searchParams);
	return { query, ...(await listEnrolments(query)) };
};

export const actions = {
	grant: async (event) => {
		const admin = requireRole(event, 'admin');
		const data = await event.request.formData();
		const email = String(data.get('email') ?? '');
		const course = String(data.get('course') ?? '');
		const parsed = grantSchema.safeParse({ email, course, reason: String(data.get('reason') ?? '') });
		if (!parsed.success) return fail(400, { grant: { ok: false, text: parsed.error.issues[0]?.message ?? 'Check the form.', email } });
		const result = await grantEnrolment(admin, parsed.data.email, parsed.data.course, parsed.data.reason);
		if (!result.ok) return fail(400, { grant: { ok: false, text: result.message, email } });
		return { grant: { ok: true, text: result.message, email: '' } };
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

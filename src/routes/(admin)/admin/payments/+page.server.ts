// Payments table (filters and search from URL params) and refunds, which close the learner's access.
import { fail } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { requireRole } from '$lib/server/guards';
import { listPayments, readPaymentsQuery, refundPayment } from '$lib/server/payments/admin-payments';
import { auditRefund } from '$lib/server/payments/audit-lines';
import { refundSchema, type RefundForm } from '$lib/forms/payments';
import type { Notice } from '$lib/forms/review';
import type { Actions, PageServerLoad } from './$types';

/** Each row has its own refund form, told apart by the payment's id (it keeps its message once the row is refunded). */
const refundFormId = (paymentId: number) => `refund-${paymentId}`;

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'admin');
	const query = readPaymentsQuery(event.url.searchParams);
	const listed = await listPayments(query);
	const forms = await Promise.all(
		listed.payments.map((p) => superValidate<RefundForm, Notice>({ paymentId: p.id }, zod4(refundSchema), { id: refundFormId(p.id), errors: false }))
	);
	return { query, ...listed, refundForms: Object.fromEntries(listed.payments.map((p, i) => [p.id, forms[i]])) };
};

export const actions = {
	refund: async (event) => {
		const admin = requireRole(event, 'admin');
		const form = await superValidate<RefundForm, Notice>(event.request, zod4(refundSchema));
		if (!form.valid) return fail(400, { form });
		const result = await refundPayment(form.data.paymentId, event.url.origin);
		if (!result.ok) return message(form, { text: result.message, ok: false }, { status: 400 });
		await auditRefund(admin, form.data.paymentId, form.data.reason);
		return message(form, { text: result.message, ok: true });
	}
} satisfies Actions;

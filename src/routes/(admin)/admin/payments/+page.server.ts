// Payments table (filters and search from URL params) and refunds, which close the learner's access.
import { fail } from '@sveltejs/kit';
import { requireRole } from '$lib/server/guards';
import { listPayments, readPaymentsQuery, refundPayment } from '$lib/server/payments/admin-payments';
import { auditRefund } from '$lib/server/payments/audit-lines';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'admin');
	const query = readPaymentsQuery(event.url.searchParams);
	return { query, ...(await listPayments(query)) };
};

export const actions = {
	refund: async (event) => {
		const admin = requireRole(event, 'admin');
		const data = await event.request.formData();
		const paymentId = Number(data.get('paymentId'));
		if (!Number.isSafeInteger(paymentId) || paymentId < 1) return fail(400, { refund: { paymentId, ok: false, text: 'Choose a payment to refund.' } });
		const result = await refundPayment(paymentId, event.url.origin);
		if (!result.ok) return fail(400, { refund: { paymentId, ok: false, text: result.message } });
		await auditRefund(admin, paymentId, String(data.get('reason') ?? ''));
		return { refund: { paymentId, ok: true, text: result.message } };
	}
} satisfies Actions;

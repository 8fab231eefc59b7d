// The learner's billing page: their payments (with receipts) and what they are enrolled in.
import { requireUser } from '$lib/server/guards';
import { listBilling } from '$lib/server/payments/billing';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireUser(event);
	return await listBilling(user.id);
};

// One receipt, for its owner only; anyone else's payment id is simply not found.
import { error } from '@sveltejs/kit';
import { requireUser } from '$lib/server/guards';
import { readReceipt } from '$lib/server/payments/billing';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireUser(event);
	const id = Number(event.params.payment);
	const receipt = Number.isSafeInteger(id) && id > 0 ? await readReceipt(user.id, id) : null;
	if (!receipt) error(404, { message: 'There is no such receipt on your account.' });
	return { receipt, email: user.email, name: user.name };
};

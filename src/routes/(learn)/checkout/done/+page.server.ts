// Where the payment page sends the learner back: settle the session now (idempotently, as the webhook does) and say so.
import { requireUser } from '$lib/server/guards';
import { confirmCheckout } from '$lib/server/payments/confirm';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireUser(event);
	const sessionId = event.url.searchParams.get('session_id') ?? '';
	return { outcome: await confirmCheckout(user, sessionId, event.url.origin) };
};

// POST /api/v1/payments/webhook: provider events. Public, but nothing is believed without a valid signature.
import { json } from '@sveltejs/kit';
import { readTextLimited } from '$lib/server/edge/read-body';
import { receiveWebhook } from '$lib/server/payments/webhook';
import type { RequestHandler } from './$types';

/** Real events are a few kilobytes; anything far larger is refused before a byte of it is parsed or kept. */
const maxWebhookBytes = 256 * 1024;

export const POST: RequestHandler = async ({ request, url }) => {
	// the raw text, not request.json(): the signature is over the exact bytes sent
	const raw = await readTextLimited(request, maxWebhookBytes);
	if (raw === null) return json({ received: false, error: 'too-large', message: 'The event is larger than any we accept.' }, { status: 413 });
	const reply = await receiveWebhook(raw, request.headers.get('stripe-signature'), url.origin);
	return json(reply.body, { status: reply.status });
};

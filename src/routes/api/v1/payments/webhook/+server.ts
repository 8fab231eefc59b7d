// POST /api/v1/payments/webhook: provider events. Public, but nothing is believed without a valid signature.
import { json } from '@sveltejs/kit';
import { receiveWebhook } from '$lib/server/payments/webhook';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = async ({ request, url }) => {
	// the raw text, not request.json(): the signature is over the exact bytes sent
	const raw = await request.text();
	const reply = await receiveWebhook(raw, request.headers.get('stripe-signature'), url.origin);
	return json(reply.body, { status: reply.status });
};

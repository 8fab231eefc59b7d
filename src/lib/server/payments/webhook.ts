// Receives provider events: checks the signature on the raw body, stores each event once, settles it in one transaction.
import { eq, sql } from 'drizzle-orm';
import type Stripe from 'stripe';
import { db } from '../db';
import { webhookEvents } from '../db/schema';
import { readStripeSettings } from './stripe';
import { checkDelivery, type CheckedDelivery } from './webhook-event';
import { settleChargeRefunded, settleSessionExpired, settleSessionPaid, type Settled } from './settle';
import { mailSettlement } from './receipts';
import type { Tx } from './enrolments';
import { isFieldDaySession, settleFieldDaySession, type FieldDaySettled } from '../field-days/payment';
import { runFollowUps } from '../field-days/follow-ups';

export type WebhookReply = {
	status: number;
	body: { received: boolean; error?: string; message?: string; duplicate?: boolean; rejected?: boolean };
};

/**
 * `rawBody` must be the exact bytes received (`await request.text()`): the signature covers them, and a body that
 * was parsed and re-serialised would no longer match.
 */
export async function receiveWebhook(rawBody: string, signature: string | null, origin: string): Promise<WebhookReply> {
	if (!signature) return { status: 400, body: { received: false, error: 'bad-signature', message: 'No Stripe-Signature header.' } };
	const secret = readStripeSettings().webhookSecret;
	if (!secret) {
		console.error('[payments] STRIPE_WEBHOOK_SECRET is not set: webhook events cannot be checked and are refused');
		return { status: 503, body: { received: false, error: 'not-configured', message: 'Webhooks are not set up on this server.' } };
	}
	const checked = checkDelivery(rawBody, signature, secret);
	if (checked.kind === 'bad-signature') return { status: 400, body: { received: false, error: 'bad-signature', message: checked.message } };
	// signed by the provider but unusable: acknowledged (a retry would be the same bytes) and kept as rejected
	if (checked.kind === 'malformed') return recordRejected(checked);
	const event = checked.event;

	let outcome: { duplicate: true } | { duplicate: false; settled: Settled | FieldDaySettled };
	try {
		outcome = await db.transaction(async (tx) => {
			const stored = await tx
				.insert(webhookEvents)
				.values({ id: event.id, type: event.type, payload: event })
				.onConflictDoNothing()
				.returning({ id: webhookEvents.id });
			// a replay (the provider retries, or redelivers by hand) finds the row and changes nothing
			if (stored.length === 0) return { duplicate: true } as const;
			const settled = await settleEvent(tx, event);
			await tx.update(webhookEvents).set({ processedAt: sql`now()` }).where(eq(webhookEvents.id, event.id));
			return { duplicate: false, settled } as const;
		});
	} catch (e) {
		// nothing was stored (the transaction rolled back): a retry of this delivery will process it afresh
		console.error(`[payments] could not process ${event.type} ${event.id}`, e instanceof Error ? e.message : e);
		return { status: 503, body: { received: false, error: 'try-again', message: 'Could not process the event just now.' } };
	}
	if (outcome.duplicate) return { status: 200, body: { received: true, duplicate: true } };
	if (outcome.settled.change === 'field-day') await runFollowUps(outcome.settled.followUps, origin);
	else mailSettlement(outcome.settled, origin);
	return { status: 200, body: { received: true } };
}

async function recordRejected(found: Extract<CheckedDelivery, { kind: 'malformed' }>): Promise<WebhookReply> {
	console.warn(`[payments] rejected a signed webhook event ${found.id}: ${found.reason}`);
	try {
		await db
			.insert(webhookEvents)
			.values({ id: found.id, type: found.type, payload: found.payload ?? {}, rejectedReason: found.reason.slice(0, 500) })
			.onConflictDoNothing();
	} catch (e) {
		console.error('[payments] could not record a rejected event', e instanceof Error ? e.message : e);
		return { status: 503, body: { received: false, error: 'try-again', message: 'Could not record the event just now.' } };
	}
	return { status: 200, body: { received: true, rejected: true, message: found.reason } };
}

function settleEvent(tx: Tx, event: Stripe.Event): Promise<Settled | FieldDaySettled> {
	// a field-day seat is paid through the same checkout: its session says so in its metadata
	if (event.type.startsWith('checkout.session.') && isFieldDaySession(event.data.object as Stripe.Checkout.Session)) {
		return settleFieldDaySession(tx, event.data.object as Stripe.Checkout.Session);
	}
	switch (event.type) {
		case 'checkout.session.completed':
		case 'checkout.session.async_payment_succeeded':
			return settleSessionPaid(tx, event.data.object);
		case 'checkout.session.expired':
			return settleSessionExpired(tx, event.data.object);
		case 'charge.refunded':
			return settleChargeRefunded(tx, event.data.object);
		default:
			// kept for the record; nothing in Stopwise depends on it
			return Promise.resolve({ change: 'none', reason: `ignored ${event.type}` });
	}
}

// Checks a signed webhook delivery: the signature and a timestamp within tolerance on both sides, then the event's shape.
import { createHash } from 'node:crypto';
import { z } from 'zod';
import type Stripe from 'stripe';
import { webhooks } from './stripe';

/** The usual five minutes either side of the signed timestamp (the provider's own default for the past). */
export const webhookToleranceSeconds = 300;

export type CheckedDelivery =
	| { kind: 'bad-signature'; message: string }
	| { kind: 'malformed'; id: string; type: string; reason: string; payload: unknown }
	| { kind: 'event'; event: Stripe.Event };

const idText = z.string().min(1).max(255);
const session = z.looseObject({ id: idText, payment_status: z.string().optional(), status: z.string().optional() });
const charge = z.looseObject({ id: idText, amount_refunded: z.number().int().min(0), refunded: z.boolean() });

const envelope = z.looseObject({
	id: idText.regex(/^evt_[\w-]+$/),
	type: z.string().min(1).max(100),
	data: z.looseObject({ object: z.looseObject({}) })
});

/** What each settled type needs from `data.object`; other types are only stored. */
const objectFor: Record<string, z.ZodType> = {
	'checkout.session.completed': session,
	'checkout.session.async_payment_succeeded': session,
	'checkout.session.expired': session,
	'charge.refunded': charge
};

export function checkDelivery(rawBody: string, signature: string, secret: string, nowSeconds = Math.floor(Date.now() / 1000)): CheckedDelivery {
	try {
		if (!webhooks.signature) throw new Error('the payment library has no signature helper');
		webhooks.signature.verifyHeader(rawBody, signature, secret, webhookToleranceSeconds, undefined, nowSeconds * 1000);
	} catch (e) {
		return { kind: 'bad-signature', message: e instanceof Error ? e.message : 'Bad signature.' };
	}
	// the library bounds only the past: a timestamp far ahead would stay replayable until then
	const stamp = Number(/(?:^|,)t=(\d+)/.exec(signature)?.[1]);
	if (!Number.isFinite(stamp) || stamp > nowSeconds + webhookToleranceSeconds) {
		return { kind: 'bad-signature', message: 'Timestamp outside the tolerance zone' };
	}

	let parsed: unknown;
	try {
		parsed = JSON.parse(rawBody);
	} catch {
		return malformed(rawBody, null, 'the body is not JSON');
	}
	// PostgreSQL stores no NUL in jsonb or text, and no real event carries one
	if (JSON.stringify(parsed).includes('\\u0000')) return malformed(rawBody, parsed, 'the event contains a NUL character');
	const shape = envelope.safeParse(parsed);
	if (!shape.success) return malformed(rawBody, parsed, `not an event: ${shape.error.issues[0]?.path.join('.') || 'body'} ${shape.error.issues[0]?.message}`);
	const needs = objectFor[shape.data.type];
	const object = needs?.safeParse(shape.data.data.object);
	if (object && !object.success) {
		return malformed(rawBody, parsed, `${shape.data.type} without a usable object: ${object.error.issues[0]?.path.join('.')} ${object.error.issues[0]?.message}`);
	}
	return { kind: 'event', event: parsed as Stripe.Event };
}

/** Recorded under its own id when it has a usable one, else under a digest of the bytes (a replay lands on the same row). */
function malformed(rawBody: string, parsed: unknown, reason: string): CheckedDelivery {
	const record = parsed && typeof parsed === 'object' && !Array.isArray(parsed) ? (parsed as Record<string, unknown>) : null;
	const ownId = typeof record?.id === 'string' && /^evt_[\w-]{1,250}$/.test(record.id) ? record.id : null;
	const id = ownId ?? `rejected_${createHash('sha256').update(rawBody).digest('hex').slice(0, 40)}`;
	const type = typeof record?.type === 'string' && /^[\w.]{1,100}$/.test(record.type) ? record.type : 'unknown';
	// PostgreSQL's jsonb refuses \u0000: keep such a payload as a note only
	const storable = parsed !== null && !JSON.stringify(parsed).includes('\\u0000');
	return { kind: 'malformed', id, type, reason, payload: storable ? parsed : { unreadable: true } };
}

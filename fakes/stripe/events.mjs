// Builds event objects shaped like the API's, keeps them, and hands them to webhook delivery.
import { createId, nowSeconds } from './ids.mjs';

/**
 * @typedef {{ store: import('./store.mjs').Store, deliverer: ReturnType<typeof import('./webhooks.mjs').createDeliverer>, apiVersion: string }} EventContext
 * @typedef {{ id: string | null, idempotency_key: string | null }} RequestInfo
 */

/**
 * The payload is fixed at creation (a snapshot of the object, pretty-printed as the real service sends it),
 * so a redelivery is byte-for-byte the same event.
 * @param {EventContext} ctx
 * @param {string} type
 * @param {Record<string, any>} object
 * @param {{ request?: RequestInfo, previous?: Record<string, any> }} [extra]
 */
export function recordEvent(ctx, type, object, extra = {}) {
	/** @type {Record<string, any>} */
	const data = { object: structuredClone(object) };
	if (extra.previous) data.previous_attributes = extra.previous;
	const event = {
		id: createId('evt'),
		object: 'event',
		api_version: ctx.apiVersion,
		created: nowSeconds(),
		data,
		livemode: false,
		pending_webhooks: ctx.deliverer.enabled ? 1 : 0,
		request: extra.request ?? { id: null, idempotency_key: null },
		type
	};
	const entry = { event, payload: JSON.stringify(event, null, 2), deliveries: [] };
	ctx.store.events.set(event.id, entry);
	ctx.store.save();
	ctx.deliverer.enqueue(entry);
	return entry;
}

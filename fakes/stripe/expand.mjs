// Replaces id references with the objects they name, for `expand[]` (dotted paths such as payment_intent.latest_charge).
import { ApiError } from './errors.mjs';

/** Which fields of which object can be expanded, and the collection holding their targets. */
const EXPANDABLE = /** @type {Record<string, Record<string, 'paymentIntents' | 'charges' | 'lineItems'>>} */ ({
	'checkout.session': { payment_intent: 'paymentIntents', line_items: 'lineItems' },
	payment_intent: { latest_charge: 'charges' },
	charge: { payment_intent: 'paymentIntents' },
	refund: { payment_intent: 'paymentIntents', charge: 'charges' }
});

/**
 * @param {Record<string, any>} object
 * @param {string[]} paths
 * @param {import('./store.mjs').Store} store
 */
export function expandObject(object, paths, store) {
	const copy = structuredClone(object);
	for (const path of paths) expandPath(copy, path.split('.'), path, store);
	return copy;
}

/**
 * @param {Record<string, any>} object
 * @param {string[]} parts
 * @param {string} full
 * @param {import('./store.mjs').Store} store
 */
function expandPath(object, [field, ...rest], full, store) {
	const collection = EXPANDABLE[object.object]?.[field];
	if (!collection) throw new ApiError(400, `This property cannot be expanded (${full}).`, { param: 'expand' });
	if (collection === 'lineItems') {
		if (rest.length) throw new ApiError(400, `This property cannot be expanded (${full}).`, { param: 'expand' });
		object.line_items = listLineItems(object.id, store);
		return;
	}
	const value = object[field];
	if (value === null || value === undefined) return;
	if (typeof value === 'string') {
		const target = store[collection].get(value);
		if (target) object[field] = structuredClone(target);
	}
	if (rest.length && typeof object[field] === 'object') expandPath(object[field], rest, full, store);
}

/**
 * @param {string} sessionId
 * @param {import('./store.mjs').Store} store
 */
export function listLineItems(sessionId, store) {
	return {
		object: 'list',
		data: structuredClone(store.lineItems.get(sessionId) ?? []),
		has_more: false,
		url: `/v1/checkout/sessions/${sessionId}/line_items`
	};
}

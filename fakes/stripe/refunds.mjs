// Refunds: checks parameters against what is left on the charge, records the refund and a charge.refunded event.
import { ApiError, invalidParam, noSuch } from './errors.mjs';
import { readInteger, readMetadata, readString, rejectUnknownKeys } from './form.mjs';
import { createId, nowSeconds } from './ids.mjs';
import { formatAmount } from './money.mjs';
import { recordEvent } from './events.mjs';

const CREATE_PARAMS = ['payment_intent', 'charge', 'amount', 'reason', 'metadata', 'expand'];
const REASONS = ['duplicate', 'fraudulent', 'requested_by_customer'];

/**
 * @param {import('./events.mjs').EventContext} ctx
 * @param {Record<string, any>} params
 * @param {import('./events.mjs').RequestInfo} request
 */
export function createRefund(ctx, params, request) {
	rejectUnknownKeys(params, CREATE_PARAMS);
	const charge = findCharge(ctx, params);
	const remaining = charge.amount - charge.amount_refunded;
	if (remaining === 0) {
		throw new ApiError(400, `Charge ${charge.id} has already been refunded.`, { code: 'charge_already_refunded' });
	}
	const amount = params.amount === undefined ? remaining : readInteger(params.amount, 'amount', 1);
	if (amount > remaining) {
		const show = (/** @type {number} */ n) => formatAmount(n, charge.currency);
		throw new ApiError(400, `Refund amount (${show(amount)}) is greater than unrefunded amount on charge (${show(remaining)})`, { param: 'amount', code: 'amount_too_large' });
	}
	const reason = params.reason === undefined ? null : readString(params.reason, 'reason');
	if (reason !== null && !REASONS.includes(reason)) throw invalidParam('reason', `Invalid reason: must be one of ${REASONS.join(', ')}`);
	const metadata = readMetadata(params.metadata, 'metadata');

	const refund = {
		id: createId('re'),
		object: 'refund',
		amount,
		balance_transaction: null,
		charge: charge.id,
		created: nowSeconds(),
		currency: charge.currency,
		metadata,
		payment_intent: charge.payment_intent,
		reason,
		receipt_number: null,
		source_transfer_reversal: null,
		status: 'succeeded',
		transfer_reversal: null
	};
	// previous_attributes on charge.refunded as the real events carry them (from memory of real payloads)
	const previous = { amount_refunded: charge.amount_refunded, refunded: charge.refunded };
	charge.amount_refunded += amount;
	// a partial refund still sends charge.refunded; `refunded` turns true only once nothing is left
	charge.refunded = charge.amount_refunded === charge.amount;
	ctx.store.refunds.set(refund.id, refund);
	ctx.store.save();
	recordEvent(ctx, 'charge.refunded', charge, { request, previous });
	return refund;
}

/**
 * @param {import('./events.mjs').EventContext} ctx
 * @param {Record<string, any>} params
 */
function findCharge(ctx, params) {
	if (params.payment_intent === undefined && params.charge === undefined) {
		throw new ApiError(400, 'One of the following params should be provided for this request: payment_intent or charge.', { code: 'parameter_missing' });
	}
	if (params.charge !== undefined) {
		const id = readString(params.charge, 'charge');
		const charge = ctx.store.charges.get(id);
		if (!charge) throw noSuch('charge', id, 'charge');
		if (params.payment_intent !== undefined && params.payment_intent !== charge.payment_intent) {
			throw invalidParam('payment_intent', `The charge ${id} does not belong to payment_intent ${params.payment_intent}.`);
		}
		return charge;
	}
	const id = readString(params.payment_intent, 'payment_intent');
	const intent = ctx.store.paymentIntents.get(id);
	if (!intent) throw noSuch('payment_intent', id, 'payment_intent');
	const charge = intent.latest_charge ? ctx.store.charges.get(intent.latest_charge) : undefined;
	if (!charge) throw invalidParam('payment_intent', `PaymentIntent ${id} has no successful charge to refund.`);
	return charge;
}

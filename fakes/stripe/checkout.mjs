// Checkout Sessions: checks create parameters, builds the session, and completes it with a payment intent and charge.
import { ApiError, invalidParam, missingParam } from './errors.mjs';
import { isHash, readInteger, readList, readMetadata, readString, rejectUnknownKeys } from './form.mjs';
import { createId, nowSeconds } from './ids.mjs';
import { isKnownCurrency } from './money.mjs';
import { recordEvent } from './events.mjs';

// anything else is refused with "Received unknown parameter", so a typo in the app fails here as it would for real
const CREATE_PARAMS = ['mode', 'line_items', 'success_url', 'cancel_url', 'client_reference_id', 'customer_email', 'metadata', 'expand', 'payment_method_types', 'locale', 'payment_intent_data'];
const MAX_AMOUNT = 99_999_999;

/**
 * @param {import('./events.mjs').EventContext} ctx
 * @param {Record<string, any>} params parsed form parameters
 * @param {string} publicUrl base URL of the payment page
 */
export function createSession(ctx, params, publicUrl) {
	rejectUnknownKeys(params, CREATE_PARAMS);
	if (params.mode === undefined) throw missingParam('mode');
	if (params.mode === 'subscription' || params.mode === 'setup') {
		throw invalidParam('mode', `mode=${params.mode} is valid for the real API but this local fake supports mode=payment only.`);
	}
	if (params.mode !== 'payment') throw invalidParam('mode', `Invalid mode: must be one of payment, setup, or subscription`);
	if (params.line_items === undefined) throw missingParam('line_items');
	const items = readLineItems(params.line_items);
	const currency = items[0].currency;
	const amount = items.reduce((sum, item) => sum + item.amount_total, 0);
	if (amount > MAX_AMOUNT) throw invalidParam('line_items', `The total amount must be no more than ${MAX_AMOUNT} (in the smallest currency unit).`);
	if (params.success_url === undefined) throw missingParam('success_url');
	const successUrl = readUrl(params.success_url, 'success_url');
	const cancelUrl = params.cancel_url === undefined ? null : readUrl(params.cancel_url, 'cancel_url');
	const clientReferenceId = params.client_reference_id === undefined ? null : readString(params.client_reference_id, 'client_reference_id');
	if (clientReferenceId !== null && clientReferenceId.length > 200) {
		throw invalidParam('client_reference_id', 'client_reference_id can have up to 200 characters.');
	}
	const customerEmail = params.customer_email === undefined ? null : readEmail(params.customer_email);
	const metadata = readMetadata(params.metadata, 'metadata');
	if (params.payment_method_types !== undefined) {
		readList(params.payment_method_types, 'payment_method_types').forEach((type, i) => {
			if (type !== 'card') throw invalidParam(`payment_method_types[${i}]`, `This local fake supports the payment method type card only (got ${type}).`);
		});
	}
	const locale = params.locale === undefined ? null : readString(params.locale, 'locale');
	const intentData = readIntentData(params.payment_intent_data);

	const id = createId('cs_test', 58);
	const created = nowSeconds();
	const session = {
		id,
		object: 'checkout.session',
		after_expiration: null,
		allow_promotion_codes: null,
		amount_subtotal: amount,
		amount_total: amount,
		automatic_tax: { enabled: false, liability: null, provider: null, status: null },
		billing_address_collection: null,
		cancel_url: cancelUrl,
		client_reference_id: clientReferenceId,
		client_secret: null,
		created,
		currency,
		custom_fields: [],
		customer: null,
		customer_creation: 'if_required',
		customer_details: null,
		customer_email: customerEmail,
		discounts: [],
		expires_at: created + 24 * 3600,
		invoice: null,
		livemode: false,
		locale,
		metadata,
		mode: 'payment',
		payment_intent: null,
		payment_link: null,
		payment_method_collection: 'if_required',
		payment_method_types: ['card'],
		payment_status: 'unpaid',
		recovered_from: null,
		setup_intent: null,
		shipping_address_collection: null,
		shipping_cost: null,
		shipping_options: [],
		status: 'open',
		submit_type: null,
		subscription: null,
		success_url: successUrl,
		total_details: { amount_discount: 0, amount_shipping: 0, amount_tax: 0 },
		ui_mode: 'hosted',
		url: `${publicUrl}/pay/${id}`
	};
	ctx.store.sessions.set(id, session);
	ctx.store.lineItems.set(id, items.map((item) => toLineItem(item)));
	// kept beside the session, not on it: the API shows it on the payment intent only
	ctx.store.intentData.set(id, intentData);
	ctx.store.save();
	return session;
}

/**
 * Marks an open session paid, creates its payment intent and charge, and records checkout.session.completed.
 * @param {import('./events.mjs').EventContext} ctx
 * @param {Record<string, any>} session
 * @param {{ brand: string, last4: string }} card
 */
export function completeSession(ctx, session, card) {
	const created = nowSeconds();
	const intentData = ctx.store.intentData.get(session.id) ?? { metadata: {}, description: null };
	const piId = createId('pi');
	const chargeId = createId('ch');
	const paymentMethod = createId('pm');
	const email = session.customer_email;
	const intent = {
		id: piId,
		object: 'payment_intent',
		amount: session.amount_total,
		amount_capturable: 0,
		amount_received: session.amount_total,
		capture_method: 'automatic_async',
		client_secret: `${piId}_secret_${createId('s').slice(2)}`,
		confirmation_method: 'automatic',
		created,
		currency: session.currency,
		customer: null,
		description: intentData.description,
		last_payment_error: null,
		latest_charge: chargeId,
		livemode: false,
		metadata: intentData.metadata,
		payment_method: paymentMethod,
		payment_method_types: ['card'],
		receipt_email: null,
		status: 'succeeded'
	};
	const charge = {
		id: chargeId,
		object: 'charge',
		amount: session.amount_total,
		amount_captured: session.amount_total,
		amount_refunded: 0,
		balance_transaction: null,
		billing_details: { address: null, email, name: null, phone: null },
		captured: true,
		created,
		currency: session.currency,
		customer: null,
		description: intentData.description,
		disputed: false,
		failure_code: null,
		failure_message: null,
		livemode: false,
		metadata: {},
		outcome: { network_status: 'approved_by_network', reason: null, risk_level: 'normal', seller_message: 'Payment complete.', type: 'authorized' },
		paid: true,
		payment_intent: piId,
		payment_method: paymentMethod,
		payment_method_details: { type: 'card', card: { brand: card.brand, last4: card.last4, funding: 'credit' } },
		receipt_url: null,
		refunded: false,
		status: 'succeeded'
	};
	ctx.store.paymentIntents.set(piId, intent);
	ctx.store.charges.set(chargeId, charge);
	Object.assign(session, {
		status: 'complete',
		payment_status: 'paid',
		payment_intent: piId,
		customer_details: { address: null, email, name: null, phone: null, tax_exempt: 'none', tax_ids: [] },
		url: null
	});
	ctx.store.save();
	recordEvent(ctx, 'checkout.session.completed', session);
	return session;
}

/**
 * Closes an open session so it can no longer be paid, and records checkout.session.expired; a session that is
 * complete or already expired is refused, as the real API does (message from memory of its wording).
 * @param {import('./events.mjs').EventContext} ctx
 * @param {string} id
 * @param {Record<string, any>} params
 */
export function expireSession(ctx, id, params) {
	rejectUnknownKeys(params, ['expand']);
	const session = ctx.store.sessions.get(id);
	if (!session) throw new ApiError(404, `No such checkout.session: '${id}'`, { param: 'session', code: 'resource_missing' });
	if (session.status !== 'open') {
		throw new ApiError(400, `Only Checkout Sessions with a status of open can be expired. This session has a status of ${session.status}.`, { code: 'checkout_session_not_open' });
	}
	Object.assign(session, { status: 'expired', url: null });
	ctx.store.save();
	recordEvent(ctx, 'checkout.session.expired', session);
	return session;
}

/**
 * The success URL with the literal {CHECKOUT_SESSION_ID} replaced, as the real service does (an encoded %7B…%7D is left alone).
 * @param {Record<string, any>} session
 */
export function successRedirect(session) {
	return String(session.success_url).replaceAll('{CHECKOUT_SESSION_ID}', session.id);
}

/** @param {unknown} value */
function readLineItems(value) {
	const list = readList(value, 'line_items');
	if (list.length === 0) throw missingParam('line_items');
	if (list.length > 100) throw invalidParam('line_items', 'A Checkout Session can have at most 100 line items.');
	const items = list.map((item, i) => readLineItem(item, `line_items[${i}]`));
	const currencies = new Set(items.map((item) => item.currency));
	if (currencies.size > 1) throw invalidParam('line_items', `All line items must use the same currency; got ${[...currencies].join(', ')}.`);
	return items;
}

/**
 * @param {unknown} item
 * @param {string} param
 */
function readLineItem(item, param) {
	if (!isHash(item)) throw invalidParam(param, `Invalid hash: ${param}`);
	const hash = /** @type {Record<string, any>} */ (item);
	rejectUnknownKeys(hash, ['price', 'price_data', 'quantity'], param);
	if (hash.price !== undefined) {
		throw new ApiError(400, `No such price: '${hash.price}' (this local fake has no Price objects; use ${param}[price_data]).`, { param: `${param}[price]`, code: 'resource_missing' });
	}
	if (hash.price_data === undefined) throw missingParam(`${param}[price_data]`);
	const priceParam = `${param}[price_data]`;
	if (!isHash(hash.price_data)) throw invalidParam(priceParam, `Invalid hash: ${priceParam}`);
	const price = hash.price_data;
	rejectUnknownKeys(price, ['currency', 'unit_amount', 'product_data'], priceParam);
	if (price.currency === undefined) throw missingParam(`${priceParam}[currency]`);
	const currency = readString(price.currency, `${priceParam}[currency]`).toLowerCase();
	if (!isKnownCurrency(currency)) throw invalidParam(`${priceParam}[currency]`, `Invalid currency: ${price.currency}.`);
	if (price.unit_amount === undefined) throw missingParam(`${priceParam}[unit_amount]`);
	const unitAmount = readInteger(price.unit_amount, `${priceParam}[unit_amount]`, 0);
	const productParam = `${priceParam}[product_data]`;
	if (price.product_data === undefined) throw missingParam(productParam);
	if (!isHash(price.product_data)) throw invalidParam(productParam, `Invalid hash: ${productParam}`);
	rejectUnknownKeys(price.product_data, ['name', 'description'], productParam);
	if (price.product_data.name === undefined) throw missingParam(`${productParam}[name]`);
	const name = readString(price.product_data.name, `${productParam}[name]`).trim();
	if (name === '') throw invalidParam(`${productParam}[name]`, 'You passed an empty string for the product name; it must not be empty.');
	const description = price.product_data.description === undefined ? null : readString(price.product_data.description, `${productParam}[description]`);
	if (hash.quantity === undefined) throw missingParam(`${param}[quantity]`);
	const quantity = readInteger(hash.quantity, `${param}[quantity]`, 1);
	return { currency, unitAmount, name, description, quantity, amount_total: unitAmount * quantity };
}

/** @param {{ currency: string, unitAmount: number, name: string, description: string | null, quantity: number, amount_total: number }} item */
function toLineItem(item) {
	return {
		id: createId('li'),
		object: 'item',
		amount_discount: 0,
		amount_subtotal: item.amount_total,
		amount_tax: 0,
		amount_total: item.amount_total,
		currency: item.currency,
		description: item.name,
		price: {
			id: createId('price'),
			object: 'price',
			active: false,
			currency: item.currency,
			livemode: false,
			product: createId('prod'),
			type: 'one_time',
			unit_amount: item.unitAmount
		},
		quantity: item.quantity
	};
}

/**
 * @param {unknown} value
 * @param {string} param
 */
function readUrl(value, param) {
	const text = readString(value, param);
	let url;
	try {
		url = new URL(text);
	} catch {
		throw invalidParam(param, `Not a valid URL: ${param}`);
	}
	if (url.protocol !== 'http:' && url.protocol !== 'https:') throw invalidParam(param, `Not a valid URL: ${param} must be http or https`);
	if (text.length > 5000) throw invalidParam(param, `${param} can have up to 5000 characters.`);
	return text;
}

/** @param {unknown} value */
function readEmail(value) {
	const email = readString(value, 'customer_email');
	if (!/^[^\s@]+@[^\s@]+\.[^\s@]+$/.test(email)) throw invalidParam('customer_email', `Invalid email address: ${email}`);
	return email;
}

/** @param {unknown} value */
function readIntentData(value) {
	if (value === undefined) return { metadata: {}, description: null };
	if (!isHash(value)) throw invalidParam('payment_intent_data', 'Invalid hash: payment_intent_data');
	const hash = /** @type {Record<string, any>} */ (value);
	rejectUnknownKeys(hash, ['metadata', 'description'], 'payment_intent_data');
	return {
		metadata: readMetadata(hash.metadata, 'payment_intent_data[metadata]'),
		description: hash.description === undefined ? null : readString(hash.description, 'payment_intent_data[description]')
	};
}

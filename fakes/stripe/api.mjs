// The /v1 API: bearer-key auth, idempotency keys, routing to sessions, intents, charges, refunds and events.
import { createHash } from 'node:crypto';
import { ApiError, noSuch } from './errors.mjs';
import { parseForm, readExpand, rejectUnknownKeys } from './form.mjs';
import { createId } from './ids.mjs';
import { createSession, expireSession } from './checkout.mjs';
import { createRefund } from './refunds.mjs';
import { expandObject, listLineItems } from './expand.mjs';
import { readBody, sendJsonText } from './http.mjs';

/**
 * @typedef {import('./events.mjs').EventContext & { publicUrl: string }} ApiContext
 * @typedef {{ method: string, path: string, params: Record<string, any>, request: import('./events.mjs').RequestInfo }} ApiRequest
 */

/** GET routes: path pattern → collection and the name used in "No such …" messages. */
const RETRIEVE = /** @type {Array<[RegExp, 'sessions' | 'paymentIntents' | 'charges' | 'refunds', string]>} */ ([
	[/^\/v1\/checkout\/sessions\/([^/]+)$/, 'sessions', 'checkout.session'],
	[/^\/v1\/payment_intents\/([^/]+)$/, 'paymentIntents', 'payment_intent'],
	[/^\/v1\/charges\/([^/]+)$/, 'charges', 'charge'],
	[/^\/v1\/refunds\/([^/]+)$/, 'refunds', 'refund']
]);

/**
 * @param {import('node:http').IncomingMessage} req
 * @param {import('node:http').ServerResponse} res
 * @param {ApiContext} ctx
 * @param {URL} url
 */
export async function handleApi(req, res, ctx, url) {
	const requestId = createId('req', 14);
	const headers = { 'Request-Id': requestId, 'Stripe-Version': ctx.apiVersion };
	const method = req.method ?? 'GET';
	try {
		checkKey(req.headers.authorization);
		const body = method === 'POST' ? await readBody(req) : '';
		const idempotencyKey = method === 'POST' ? headerValue(req.headers['idempotency-key']) : null;
		const fingerprint = createHash('sha256').update(`${method} ${url.pathname}${url.search}\n${body}`).digest('hex');
		if (idempotencyKey) {
			const saved = ctx.store.idempotency.get(idempotencyKey);
			if (saved && saved.fingerprint !== fingerprint) {
				throw new ApiError(400, `Keys for idempotent requests can only be used with the same parameters they were first used with. Try using a key other than '${idempotencyKey}' if you meant to execute a different request.`, { type: 'idempotency_error' });
			}
			if (saved) return sendJsonText(res, saved.status, saved.body, { ...headers, 'Idempotent-Replayed': 'true', 'Original-Request': requestId });
		}
		const params = parseForm(method === 'POST' ? body : url.search.slice(1));
		const result = route({ method, path: url.pathname, params, request: { id: requestId, idempotency_key: idempotencyKey } }, ctx);
		const text = JSON.stringify(result, null, 2);
		// only successes are kept, as the API does not save requests that failed validation
		if (idempotencyKey) {
			ctx.store.idempotency.set(idempotencyKey, { fingerprint, status: 200, body: text });
			ctx.store.save();
		}
		sendJsonText(res, 200, text, headers);
	} catch (e) {
		const error = e instanceof ApiError ? e : new ApiError(500, 'The local fake failed unexpectedly; see its log.', { type: 'api_error' });
		if (!(e instanceof ApiError)) console.error('stripe fake: unexpected error', e);
		sendJsonText(res, error.status, JSON.stringify(error.toBody(), null, 2), headers);
	}
}

/**
 * Any key starting sk_test_ is accepted, given as a bearer token or as the basic-auth user name.
 * @param {string | undefined} authorization
 */
function checkKey(authorization) {
	if (!authorization) {
		throw new ApiError(401, "You did not provide an API key. You need to provide your API key in the Authorization header, using Bearer auth (e.g. 'Authorization: Bearer YOUR_SECRET_KEY').");
	}
	const [scheme, value = ''] = authorization.split(/\s+/, 2);
	let key = value;
	if (/^basic$/i.test(scheme)) key = Buffer.from(value, 'base64').toString('utf8').split(':')[0];
	else if (!/^bearer$/i.test(scheme)) throw new ApiError(401, 'Invalid Authorization header: use Bearer auth with your secret key.');
	if (!/^sk_test_\S+$/.test(key)) {
		throw new ApiError(401, `Invalid API Key provided: ${redactKey(key)}`);
	}
}

/** @param {string} key */
function redactKey(key) {
	return key.length > 8 ? `${key.slice(0, 8)}${'*'.repeat(Math.max(0, Math.min(key.length - 12, 20)))}${key.slice(-4)}` : '****';
}

/** @param {string | string[] | undefined} value */
function headerValue(value) {
	return Array.isArray(value) ? value[0] ?? null : value ?? null;
}

/**
 * @param {ApiRequest} request
 * @param {ApiContext} ctx
 */
function route({ method, path, params, request }, ctx) {
	if (method === 'POST' && path === '/v1/checkout/sessions') {
		const session = createSession(ctx, params, ctx.publicUrl);
		return expandObject(session, readExpand(params.expand), ctx.store);
	}
	const expire = /^\/v1\/checkout\/sessions\/([^/]+)\/expire$/.exec(path);
	if (method === 'POST' && expire) {
		const session = expireSession(ctx, decodeURIComponent(expire[1]), params);
		return expandObject(session, readExpand(params.expand), ctx.store);
	}
	if (method === 'POST' && path === '/v1/refunds') {
		const refund = createRefund(ctx, params, request);
		return expandObject(refund, readExpand(params.expand), ctx.store);
	}
	if (method === 'GET') {
		rejectUnknownKeys(params, ['expand']);
		const expand = readExpand(params.expand);
		const lineItems = /^\/v1\/checkout\/sessions\/([^/]+)\/line_items$/.exec(path);
		if (lineItems) {
			const id = decodeURIComponent(lineItems[1]);
			if (!ctx.store.sessions.has(id)) throw noSuch('checkout.session', id);
			return listLineItems(id, ctx.store);
		}
		const event = /^\/v1\/events\/([^/]+)$/.exec(path);
		if (event) {
			const id = decodeURIComponent(event[1]);
			const entry = ctx.store.events.get(id);
			if (!entry) throw noSuch('event', id);
			return JSON.parse(entry.payload);
		}
		for (const [pattern, collection, name] of RETRIEVE) {
			const match = pattern.exec(path);
			if (!match) continue;
			const id = decodeURIComponent(match[1]);
			const object = ctx.store[collection].get(id);
			if (!object) throw noSuch(name, id);
			return expandObject(object, expand, ctx.store);
		}
	}
	throw new ApiError(404, `Unrecognized request URL (${method}: ${path}). This local fake implements only what the app uses.`);
}

// Test-only control endpoints under /__fake: list events with their delivery attempts, redeliver one.
import { ApiError } from './errors.mjs';
import { sendJson } from './http.mjs';

/**
 * @param {import('node:http').IncomingMessage} req
 * @param {import('node:http').ServerResponse} res
 * @param {import('./events.mjs').EventContext} ctx
 * @param {string} path
 */
export function handleControl(req, res, ctx, path) {
	if (req.method === 'GET' && path === '/__fake/events') {
		const data = [...ctx.store.events.values()].map((entry) => ({ event: JSON.parse(entry.payload), deliveries: entry.deliveries }));
		return sendJson(res, 200, { object: 'list', data });
	}
	const redeliver = /^\/__fake\/redeliver\/([^/]+)$/.exec(path);
	if (req.method === 'POST' && redeliver) {
		const id = decodeURIComponent(redeliver[1]);
		const entry = ctx.store.events.get(id);
		if (!entry) throw new ApiError(404, `No such event: '${id}'`, { param: 'id', code: 'resource_missing' });
		if (!ctx.deliverer.enabled) throw new ApiError(409, 'No webhook URL is set (STRIPE_WEBHOOK_URL), so there is nowhere to deliver to.');
		ctx.deliverer.enqueue(entry);
		return sendJson(res, 202, { id, redelivery: 'queued' });
	}
	throw new ApiError(404, `Unrecognized control URL (${req.method}: ${path}).`);
}

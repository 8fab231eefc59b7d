// Local stand-in for the payment provider's API, payment page and signed webhooks; node built-ins only.
import { createServer } from 'node:http';
import { readConfig } from './config.mjs';
import { openStore } from './store.mjs';
import { createDeliverer } from './webhooks.mjs';
import { handleApi } from './api.mjs';
import { handlePayPage } from './pay-page.mjs';
import { handleControl } from './control.mjs';
import { ApiError } from './errors.mjs';
import { sendJson } from './http.mjs';

/** @type {import('./config.mjs').Config} */
let config;
/** @type {import('./store.mjs').Store} */
let store;
try {
	config = readConfig(process.env);
	store = openStore(config.stateFile);
} catch (e) {
	console.error(`stripe fake: ${e instanceof Error ? e.message : e}`);
	process.exit(1);
}

const deliverer = createDeliverer(
	{ url: config.webhookUrl, secret: config.webhookSecret, maxAttempts: config.maxAttempts, retryBaseMs: config.retryBaseMs, timeoutMs: config.timeoutMs },
	() => store.save()
);
const ctx = { store, deliverer, apiVersion: config.apiVersion, publicUrl: '' };

const server = createServer(async (req, res) => {
	const url = new URL(req.url ?? '/', 'http://127.0.0.1');
	try {
		if (url.pathname.startsWith('/v1/')) return await handleApi(req, res, ctx, url);
		const pay = /^\/pay\/([^/]+)$/.exec(url.pathname);
		if (pay) return await handlePayPage(req, res, ctx, decodeURIComponent(pay[1]));
		if (url.pathname.startsWith('/__fake/')) return handleControl(req, res, ctx, url.pathname);
		throw new ApiError(404, `Unrecognized request URL (${req.method}: ${url.pathname}).`);
	} catch (e) {
		const error = e instanceof ApiError ? e : new ApiError(500, 'The local fake failed unexpectedly; see its log.', { type: 'api_error' });
		if (!(e instanceof ApiError)) console.error('stripe fake: unexpected error', e);
		if (!res.headersSent) sendJson(res, error.status, error.toBody());
		else res.destroy();
	}
});

server.on('error', (e) => {
	console.error(`stripe fake: cannot listen on 127.0.0.1:${config.port} (${e.message})`);
	process.exit(1);
});

server.listen(config.port, '127.0.0.1', () => {
	const address = server.address();
	const port = typeof address === 'object' && address ? address.port : config.port;
	// port 0 picks a free port; the page links must use the one actually chosen
	ctx.publicUrl = config.publicUrl ?? `http://127.0.0.1:${port}`;
	console.log(`stripe fake ready on http://127.0.0.1:${port}`);
});

function shutdown() {
	deliverer.stop();
	store.save();
	server.close(() => process.exit(0));
	server.closeAllConnections();
}
process.on('SIGTERM', shutdown);
process.on('SIGINT', shutdown);

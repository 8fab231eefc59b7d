// Small node:http helpers: read a bounded body, answer with JSON, HTML or a redirect.
import { ApiError } from './errors.mjs';

const MAX_BODY = 1024 * 1024;

/**
 * @param {import('node:http').IncomingMessage} req
 * @returns {Promise<string>}
 */
export function readBody(req) {
	return new Promise((resolve, reject) => {
		/** @type {Buffer[]} */
		const chunks = [];
		let size = 0;
		req.on('data', (chunk) => {
			size += chunk.length;
			if (size > MAX_BODY) {
				reject(new ApiError(413, `Request body too large (over ${MAX_BODY} bytes).`));
				req.destroy();
				return;
			}
			chunks.push(chunk);
		});
		req.on('end', () => resolve(Buffer.concat(chunks).toString('utf8')));
		req.on('error', reject);
	});
}

/**
 * @param {import('node:http').ServerResponse} res
 * @param {number} status
 * @param {string} body already serialised JSON
 * @param {Record<string, string>} [headers]
 */
export function sendJsonText(res, status, body, headers = {}) {
	res.writeHead(status, { 'Content-Type': 'application/json', 'Content-Length': Buffer.byteLength(body), ...headers });
	res.end(body);
}

/**
 * @param {import('node:http').ServerResponse} res
 * @param {number} status
 * @param {unknown} value
 * @param {Record<string, string>} [headers]
 */
export function sendJson(res, status, value, headers = {}) {
	sendJsonText(res, status, JSON.stringify(value, null, 2), headers);
}

/**
 * @param {import('node:http').ServerResponse} res
 * @param {number} status
 * @param {string} html
 */
export function sendHtml(res, status, html) {
	res.writeHead(status, {
		'Content-Type': 'text/html; charset=utf-8',
		'Content-Length': Buffer.byteLength(html),
		'Cache-Control': 'no-store',
		'Content-Security-Policy': "default-src 'none'; style-src 'unsafe-inline'; form-action 'self' http: https:"
	});
	res.end(html);
}

/**
 * 303, so the browser follows a form POST with a GET.
 * @param {import('node:http').ServerResponse} res
 * @param {string} location
 */
export function redirect(res, location) {
	res.writeHead(303, { Location: location, 'Content-Length': 0 });
	res.end();
}

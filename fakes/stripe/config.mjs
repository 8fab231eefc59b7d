// Reads the fake's settings from the environment and says clearly which one is wrong.

/**
 * @typedef {{ port: number, publicUrl: string | undefined, webhookUrl: string | undefined, webhookSecret: string,
 *   stateFile: string | undefined, apiVersion: string, maxAttempts: number, retryBaseMs: number, timeoutMs: number }} Config
 */

/** The API version the pinned SDK sends (stripe 23.1.0); an endpoint's events carry one such version. */
const DEFAULT_API_VERSION = '2026-10-28.endive';

/**
 * @param {NodeJS.ProcessEnv} env
 * @returns {Config}
 */
export function readConfig(env) {
	const webhookUrl = env.STRIPE_WEBHOOK_URL || undefined;
	if (webhookUrl !== undefined) checkHttpUrl(webhookUrl, 'STRIPE_WEBHOOK_URL');
	const publicUrl = env.STRIPE_FAKE_PUBLIC_URL ? env.STRIPE_FAKE_PUBLIC_URL.replace(/\/+$/, '') : undefined;
	if (publicUrl !== undefined) checkHttpUrl(publicUrl, 'STRIPE_FAKE_PUBLIC_URL');
	return {
		port: readNumber(env, 'STRIPE_FAKE_PORT', 12111, 0, 65535),
		publicUrl,
		webhookUrl,
		webhookSecret: env.STRIPE_WEBHOOK_SECRET || 'whsec_stopwise_local',
		stateFile: env.STRIPE_FAKE_STATE || undefined,
		apiVersion: env.STRIPE_FAKE_API_VERSION || DEFAULT_API_VERSION,
		maxAttempts: readNumber(env, 'STRIPE_FAKE_WEBHOOK_ATTEMPTS', 5, 1, 20),
		retryBaseMs: readNumber(env, 'STRIPE_FAKE_RETRY_BASE_MS', 1000, 0, 600_000),
		timeoutMs: readNumber(env, 'STRIPE_FAKE_WEBHOOK_TIMEOUT_MS', 10_000, 100, 120_000)
	};
}

/**
 * @param {NodeJS.ProcessEnv} env
 * @param {string} name
 * @param {number} fallback
 * @param {number} min
 * @param {number} max
 */
function readNumber(env, name, fallback, min, max) {
	const text = env[name];
	if (text === undefined || text === '') return fallback;
	const n = Number(text);
	if (!Number.isInteger(n) || n < min || n > max) throw new Error(`${name} must be a whole number from ${min} to ${max}; got "${text}"`);
	return n;
}

/**
 * @param {string} text
 * @param {string} name
 */
function checkHttpUrl(text, name) {
	let url;
	try {
		url = new URL(text);
	} catch {
		throw new Error(`${name} must be an http(s) URL; got "${text}"`);
	}
	if (url.protocol !== 'http:' && url.protocol !== 'https:') throw new Error(`${name} must be an http(s) URL; got "${text}"`);
}

// Signs event payloads like the real service (t=<unix>,v1=<HMAC-SHA256 of "t.body">) and POSTs them with bounded retries.
import { createHmac } from 'node:crypto';

/**
 * @param {string} payload the exact body that will be sent
 * @param {string} secret
 * @param {number} timestamp unix seconds
 */
export function signPayload(payload, secret, timestamp) {
	const signature = createHmac('sha256', secret).update(`${timestamp}.${payload}`, 'utf8').digest('hex');
	return `t=${timestamp},v1=${signature}`;
}

/**
 * @typedef {{ url: string | undefined, secret: string, maxAttempts: number, retryBaseMs: number, timeoutMs: number }} DeliveryConfig
 * @typedef {import('./store.mjs').EventEntry} EventEntry
 */

/**
 * @param {DeliveryConfig} config
 * @param {() => void} onAttempt called after each attempt is recorded (to persist state)
 */
export function createDeliverer(config, onAttempt) {
	const stopping = new AbortController();

	/**
	 * Sends one event until an endpoint answers 2xx or the attempts run out; never throws.
	 * @param {EventEntry} entry
	 */
	async function deliver(entry) {
		if (!config.url) return;
		for (let attempt = 1; attempt <= config.maxAttempts; attempt++) {
			if (stopping.signal.aborted) return;
			const result = await postOnce(config.url, entry.payload);
			entry.deliveries.push({ attempt, at: new Date().toISOString(), ...result });
			onAttempt();
			if (result.ok || attempt === config.maxAttempts) return;
			// doubling waits, as the real service backs off (its waits are hours; ours are short for local use)
			await wait(config.retryBaseMs * 2 ** (attempt - 1), stopping.signal);
		}
	}

	/**
	 * @param {string} url
	 * @param {string} payload
	 * @returns {Promise<{ ok: boolean, status: number | null, error: string | null }>}
	 */
	async function postOnce(url, payload) {
		// signed afresh on every attempt, with the time of that attempt
		const header = signPayload(payload, config.secret, Math.floor(Date.now() / 1000));
		try {
			const response = await fetch(url, {
				method: 'POST',
				headers: { 'Content-Type': 'application/json; charset=utf-8', 'Stripe-Signature': header, 'User-Agent': 'stripe-fake/1.0' },
				body: payload,
				// a redirect is a failed delivery, as with the real service
				redirect: 'manual',
				signal: AbortSignal.any([AbortSignal.timeout(config.timeoutMs), stopping.signal])
			});
			await response.arrayBuffer().catch(() => undefined);
			const ok = response.status >= 200 && response.status < 300;
			return { ok, status: response.status, error: ok ? null : `endpoint answered ${response.status}` };
		} catch (e) {
			return { ok: false, status: null, error: e instanceof Error ? `${e.name}: ${e.message}` : String(e) };
		}
	}

	return {
		/** Starts delivery in the background. @param {EventEntry} entry */
		enqueue(entry) {
			void deliver(entry);
		},
		get enabled() {
			return Boolean(config.url);
		},
		stop() {
			stopping.abort();
		}
	};
}

/**
 * @param {number} ms
 * @param {AbortSignal} signal
 */
function wait(ms, signal) {
	return new Promise((resolve) => {
		const done = () => {
			clearTimeout(timer);
			signal.removeEventListener('abort', done);
			resolve(undefined);
		};
		const timer = setTimeout(done, ms);
		signal.addEventListener('abort', done, { once: true });
	});
}

// Payment test helpers: a private payment-provider fake on a free port, signed webhook events, and the webhook route.
import { spawn, type ChildProcess } from 'node:child_process';
import { once } from 'node:events';
import { createServer, type Server } from 'node:http';
import { randomBytes } from 'node:crypto';
import { fileURLToPath } from 'node:url';
import Stripe from 'stripe';
import { inArray } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { webhookEvents } from '$lib/server/db/schema';
import { POST as webhookPost } from '../../../src/routes/api/v1/payments/webhook/+server';
import { origin } from './request-event';

const SERVER = fileURLToPath(new URL('../../../fakes/stripe/server.mjs', import.meta.url));
export const testWebhookSecret = 'whsec_integration_only';

export type Fake = { child: ChildProcess; port: number; base: string };

/** Starts fakes/stripe on a free port, sending its events to `webhookUrl` (or nowhere). */
export async function startStripeFake(webhookUrl = ''): Promise<Fake> {
	const child = spawn(process.execPath, [SERVER], {
		env: {
			...process.env,
			STRIPE_FAKE_PORT: '0',
			STRIPE_WEBHOOK_URL: webhookUrl,
			STRIPE_WEBHOOK_SECRET: testWebhookSecret,
			STRIPE_FAKE_STATE: '',
			STRIPE_FAKE_PUBLIC_URL: '',
			STRIPE_FAKE_RETRY_BASE_MS: '50'
		},
		stdio: ['ignore', 'pipe', 'inherit']
	});
	const port = await new Promise<number>((resolve, reject) => {
		let out = '';
		child.stdout?.on('data', (chunk: Buffer) => {
			out += chunk.toString();
			const match = /ready on http:\/\/127\.0\.0\.1:(\d+)/.exec(out);
			if (match) resolve(Number(match[1]));
		});
		child.on('close', (code) => reject(new Error(`stripe fake exited with ${code}`)));
	});
	return { child, port, base: `http://127.0.0.1:${port}` };
}

export async function stopStripeFake(fake: Fake | undefined): Promise<void> {
	if (!fake || fake.child.exitCode !== null) return;
	const exited = once(fake.child, 'exit');
	fake.child.kill('SIGTERM');
	await exited;
}

const stripeKeys = ['STRIPE_SECRET_KEY', 'STRIPE_WEBHOOK_SECRET', 'STRIPE_API_HOST', 'STRIPE_API_PORT', 'STRIPE_API_PROTOCOL'] as const;

/** Points the app's payment client at `port` (or, with null, at nothing); returns a function that puts env back. */
export function pointAppAt(port: number | null): () => void {
	const saved = Object.fromEntries(stripeKeys.map((k) => [k, process.env[k]]));
	Object.assign(process.env, {
		STRIPE_SECRET_KEY: 'sk_test_integration',
		STRIPE_WEBHOOK_SECRET: testWebhookSecret,
		STRIPE_API_HOST: '127.0.0.1',
		STRIPE_API_PORT: String(port ?? 1),
		STRIPE_API_PROTOCOL: 'http'
	});
	return () => {
		for (const k of stripeKeys) {
			if (saved[k] === undefined) delete process.env[k];
			else process.env[k] = saved[k];
		}
	};
}

const sentEventIds: string[] = [];

/** A signed event as the provider would send it; its id is remembered for `removeTestEvents`. */
export function signedEvent(type: string, object: Record<string, unknown>, options: { id?: string; secret?: string; timestamp?: number } = {}) {
	const id = options.id ?? `evt_test_${randomBytes(8).toString('hex')}`;
	sentEventIds.push(id);
	const event = { id, object: 'event', api_version: '2026-10-28.endive', created: Math.floor(Date.now() / 1000), data: { object }, livemode: false, pending_webhooks: 1, request: { id: null, idempotency_key: null }, type };
	const body = JSON.stringify(event, null, 2);
	const header = Stripe.webhooks.generateTestHeaderString({ payload: body, secret: options.secret ?? testWebhookSecret, timestamp: options.timestamp });
	return { id, body, header };
}

/** POSTs a body to the webhook route the way the provider does. */
export async function postWebhook(body: string, header: string | null): Promise<{ status: number; json: Record<string, unknown> }> {
	const url = new URL('/api/v1/payments/webhook', origin);
	const headers: Record<string, string> = { 'content-type': 'application/json; charset=utf-8' };
	if (header !== null) headers['stripe-signature'] = header;
	const request = new Request(url, { method: 'POST', body, headers });
	const response = await webhookPost({ request, url } as never);
	return { status: response.status, json: await response.json() };
}

/** A local endpoint the fake delivers to, which hands each delivery to the webhook route. */
export async function startWebhookRelay(): Promise<{ url: string; statuses: number[]; close: () => Promise<void> }> {
	const statuses: number[] = [];
	const server: Server = createServer((req, res) => {
		let body = '';
		req.setEncoding('utf8');
		req.on('data', (chunk: string) => (body += chunk));
		req.on('end', async () => {
			const event = JSON.parse(body) as { id: string };
			sentEventIds.push(event.id);
			const reply = await postWebhook(body, String(req.headers['stripe-signature'] ?? ''));
			statuses.push(reply.status);
			res.writeHead(reply.status, { 'content-type': 'application/json' }).end(JSON.stringify(reply.json));
		});
	});
	server.listen(0, '127.0.0.1');
	await once(server, 'listening');
	const address = server.address();
	if (!address || typeof address === 'string') throw new Error('relay has no port');
	return {
		url: `http://127.0.0.1:${address.port}/api/v1/payments/webhook`,
		statuses,
		close: () => new Promise<void>((resolve) => server.close(() => resolve()))
	};
}

/** Webhook events are not tied to people: remove the ones this file sent, so reruns start clean. */
export async function removeTestEvents(): Promise<void> {
	if (sentEventIds.length) await db.delete(webhookEvents).where(inArray(webhookEvents.id, sentEventIds.splice(0)));
}

/** Waits until `check` returns a value (deliveries happen in the background). */
export async function waitUntil<T>(check: () => Promise<T | null | undefined | false>, what: string, timeoutMs = 5000): Promise<T> {
	const deadline = Date.now() + timeoutMs;
	for (;;) {
		const value = await check();
		if (value) return value;
		if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
		await new Promise((r) => setTimeout(r, 25));
	}
}

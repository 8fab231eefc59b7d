// Drives the local payment-provider fake with the real SDK: checkout, its payment page, signed webhooks, refunds, errors.
import { spawn, type ChildProcess } from 'node:child_process';
import { once } from 'node:events';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { createServer, type IncomingHttpHeaders } from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import Stripe from 'stripe';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';

const SERVER = fileURLToPath(new URL('../../fakes/stripe/server.mjs', import.meta.url));
const SECRET = 'whsec_spec_only_secret';
const RETRY_BASE_MS = 20;

type Fake = { child: ChildProcess; port: number; base: string; stderr: () => string };
type Delivery = { headers: IncomingHttpHeaders; body: string; event: { id: string; type: string; data: { object: Record<string, unknown> } } };
type ListedEvent = { event: Delivery['event']; deliveries: Array<{ attempt: number; status: number | null; ok: boolean }> };

/** Starts server.mjs on a free port (STRIPE_FAKE_PORT=0) and reads the port from its ready line. */
async function startFake(env: Record<string, string>): Promise<Fake> {
	const child = spawn(process.execPath, [SERVER], {
		env: { ...process.env, STRIPE_FAKE_PORT: '0', STRIPE_WEBHOOK_URL: '', STRIPE_FAKE_STATE: '', STRIPE_FAKE_PUBLIC_URL: '', ...env },
		stdio: ['ignore', 'pipe', 'pipe']
	});
	let errors = '';
	child.stderr?.on('data', (chunk: Buffer) => (errors += chunk.toString()));
	const port = await new Promise<number>((resolve, reject) => {
		let out = '';
		child.stdout?.on('data', (chunk: Buffer) => {
			out += chunk.toString();
			const match = /stripe fake ready on http:\/\/127\.0\.0\.1:(\d+)/.exec(out);
			if (match) resolve(Number(match[1]));
		});
		child.on('close', (code) => reject(new Error(`fake exited with ${code}: ${errors}`)));
	});
	return { child, port, base: `http://127.0.0.1:${port}`, stderr: () => errors };
}

async function stopFake(fake: Fake): Promise<number | null> {
	if (fake.child.exitCode !== null) return fake.child.exitCode;
	const exited = once(fake.child, 'exit');
	fake.child.kill('SIGTERM');
	const [code] = await exited;
	return code as number | null;
}

function sdk(port: number, key = 'sk_test_spec') {
	return new Stripe(key, { host: '127.0.0.1', port, protocol: 'http', maxNetworkRetries: 0, telemetry: false });
}

/** A webhook endpoint that records every delivery and can be told to fail the next n of them. */
async function startReceiver() {
	const deliveries: Delivery[] = [];
	let failuresLeft = 0;
	const server = createServer((req, res) => {
		let body = '';
		req.setEncoding('utf8');
		req.on('data', (chunk: string) => (body += chunk));
		req.on('end', () => {
			deliveries.push({ headers: req.headers, body, event: JSON.parse(body) });
			const fail = failuresLeft > 0;
			if (fail) failuresLeft--;
			res.writeHead(fail ? 500 : 200).end();
		});
	});
	server.listen(0, '127.0.0.1');
	await once(server, 'listening');
	const address = server.address();
	if (!address || typeof address === 'string') throw new Error('receiver has no port');
	return {
		url: `http://127.0.0.1:${address.port}/api/v1/payments/webhook`,
		deliveries,
		failNext(n: number) {
			failuresLeft = n;
		},
		/** Waits until `count` deliveries match, then returns them. */
		async waitFor(match: (d: Delivery) => boolean, count = 1) {
			const deadline = Date.now() + 5000;
			for (;;) {
				const found = deliveries.filter(match);
				if (found.length >= count) return found;
				if (Date.now() > deadline) throw new Error(`expected ${count} matching deliveries, got ${found.length}`);
				await new Promise((r) => setTimeout(r, 20));
			}
		},
		close: () => new Promise<void>((resolve) => server.close(() => resolve()))
	};
}

/** Reads the page's form the way a browser would: action (absent = the page itself), field and button names. */
function readForm(html: string, pageUrl: string) {
	const form = /<form\b([^>]*)>([\s\S]*?)<\/form>/.exec(html);
	if (!form) throw new Error('no form on the page');
	const action = /\baction="([^"]*)"/.exec(form[1])?.[1];
	const method = /\bmethod="([^"]*)"/.exec(form[1])?.[1];
	const inputs = [...form[2].matchAll(/<input\b[^>]*\bname="([^"]+)"/g)].map((m) => m[1]);
	const buttons = [...form[2].matchAll(/<button\b[^>]*\bname="([^"]+)"[^>]*\bvalue="([^"]+)"[^>]*>([^<]*)</g)].map((m) => ({ name: m[1], value: m[2], label: m[3] }));
	return { url: new URL(action ?? '', pageUrl).toString(), method, inputs, buttons };
}

async function submitForm(url: string, fields: Record<string, string>) {
	return fetch(url, { method: 'POST', body: new URLSearchParams(fields), redirect: 'manual' });
}

async function listEvents(base: string): Promise<ListedEvent[]> {
	const response = await fetch(`${base}/__fake/events`);
	return ((await response.json()) as { data: ListedEvent[] }).data;
}

const enrolment: Stripe.Checkout.SessionCreateParams = {
	mode: 'payment',
	line_items: [{ price_data: { currency: 'usd', unit_amount: 14900, product_data: { name: 'Daylight Flash for Action' } }, quantity: 1 }],
	success_url: 'http://127.0.0.1:3000/enrol/done?session={CHECKOUT_SESSION_ID}',
	cancel_url: 'http://127.0.0.1:3000/enrol/cancelled',
	client_reference_id: 'enrolment-42',
	customer_email: 'rower@harborlane.example',
	metadata: { course: 'daylight-flash-for-action', learner: '42' }
};

describe('stripe fake with a webhook endpoint', () => {
	let fake: Fake;
	let receiver: Awaited<ReturnType<typeof startReceiver>>;
	let stripe: Stripe;

	beforeAll(async () => {
		receiver = await startReceiver();
		fake = await startFake({ STRIPE_WEBHOOK_URL: receiver.url, STRIPE_WEBHOOK_SECRET: SECRET, STRIPE_FAKE_RETRY_BASE_MS: String(RETRY_BASE_MS) });
		stripe = sdk(fake.port);
	});
	afterAll(async () => {
		if (fake) expect(await stopFake(fake)).toBe(0);
		await receiver?.close();
	});

	test('a key that is not a test secret key, or none, gets 401 in the API error shape', async () => {
		await expect(sdk(fake.port, 'sk_live_not_accepted_here').checkout.sessions.create(enrolment)).rejects.toMatchObject({
			type: 'StripeAuthenticationError',
			statusCode: 401
		});
		const response = await fetch(`${fake.base}/v1/checkout/sessions/cs_test_any`);
		expect(response.status).toBe(401);
		const body = await response.json();
		expect(body.error.type).toBe('invalid_request_error');
		expect(body.error.message).toMatch(/did not provide an API key/);
	});

	test('creates a session from the SDK params and retrieves the same session', async () => {
		const session = await stripe.checkout.sessions.create(enrolment);
		expect(session.id).toMatch(/^cs_test_/);
		expect(session).toMatchObject({
			object: 'checkout.session',
			mode: 'payment',
			status: 'open',
			payment_status: 'unpaid',
			amount_total: 14900,
			currency: 'usd',
			client_reference_id: 'enrolment-42',
			customer_email: 'rower@harborlane.example',
			metadata: { course: 'daylight-flash-for-action', learner: '42' },
			success_url: enrolment.success_url,
			cancel_url: enrolment.cancel_url,
			payment_intent: null,
			livemode: false,
			url: `${fake.base}/pay/${session.id}`
		});
		const again = await stripe.checkout.sessions.retrieve(session.id);
		expect(again).toEqual(session);
		const withItems = await stripe.checkout.sessions.retrieve(session.id, { expand: ['line_items'] });
		expect(withItems.line_items?.data.map((i) => [i.description, i.quantity, i.amount_total])).toEqual([['Daylight Flash for Action', 1, 14900]]);
	});

	test('sums several line items and quantities into amount_total', async () => {
		const session = await stripe.checkout.sessions.create({
			...enrolment,
			line_items: [
				{ price_data: { currency: 'eur', unit_amount: 2500, product_data: { name: 'Sync Gate critique' } }, quantity: 3 },
				{ price_data: { currency: 'eur', unit_amount: 990, product_data: { name: 'Light Plan review' } }, quantity: 1 }
			]
		});
		expect(session.amount_total).toBe(3 * 2500 + 990);
		expect(session.currency).toBe('eur');
	});

	test('bad params get 400 with type, message and param; an unknown id gets 404', async () => {
		const noName = { ...enrolment, line_items: [{ price_data: { currency: 'usd', unit_amount: 100, product_data: { name: ' ' } }, quantity: 1 }] };
		await expect(stripe.checkout.sessions.create(noName)).rejects.toMatchObject({
			type: 'StripeInvalidRequestError',
			statusCode: 400,
			param: 'line_items[0][price_data][product_data][name]'
		});
		const noPrice = { ...enrolment, line_items: [{ quantity: 1 }] };
		await expect(stripe.checkout.sessions.create(noPrice)).rejects.toMatchObject({ statusCode: 400, param: 'line_items[0][price_data]' });
		const typo = { ...enrolment, sucess_url: 'http://127.0.0.1:3000/' } as unknown as Stripe.Checkout.SessionCreateParams;
		await expect(stripe.checkout.sessions.create(typo)).rejects.toMatchObject({ statusCode: 400, param: 'sucess_url', message: 'Received unknown parameter: sucess_url' });
		await expect(stripe.checkout.sessions.create({ ...enrolment, line_items: [{ ...enrolment.line_items![0], quantity: 0 }] })).rejects.toMatchObject({
			statusCode: 400,
			param: 'line_items[0][quantity]'
		});
		await expect(stripe.checkout.sessions.create({ ...enrolment, success_url: 'not a url' })).rejects.toMatchObject({ statusCode: 400, param: 'success_url' });
		const created = await stripe.checkout.sessions.create(enrolment);
		await expect(stripe.checkout.sessions.retrieve(created.id, { expand: ['customer_details'] })).rejects.toMatchObject({
			statusCode: 400,
			message: 'This property cannot be expanded (customer_details).'
		});
		await expect(stripe.checkout.sessions.retrieve('cs_test_nothing_here')).rejects.toMatchObject({
			type: 'StripeInvalidRequestError',
			statusCode: 404,
			code: 'resource_missing'
		});
	});

	test('the payment page shows the amount, a card field, Pay and Cancel, with names escaped', async () => {
		const session = await stripe.checkout.sessions.create({
			...enrolment,
			line_items: [{ price_data: { currency: 'usd', unit_amount: 14900, product_data: { name: 'Rowing <b>dawn</b> shoot' } }, quantity: 1 }]
		});
		const response = await fetch(session.url!);
		expect(response.status).toBe(200);
		const html = await response.text();
		expect(html).toContain('$149.00');
		expect(html).toContain('Rowing &#60;b&#62;dawn&#60;/b&#62; shoot');
		expect(html).not.toContain('<b>dawn');
		const form = readForm(html, session.url!);
		expect(form.method).toBe('post');
		expect(form.url).toBe(session.url);
		expect(form.inputs).toContain('card');
		expect(form.buttons.map((b) => b.value)).toEqual(['pay', 'cancel']);
	});

	test('a declined card keeps the session open and shows the message on the page', async () => {
		const session = await stripe.checkout.sessions.create(enrolment);
		const form = readForm(await (await fetch(session.url!)).text(), session.url!);
		const response = await submitForm(form.url, { card: '4000 0000 0000 0002', action: 'pay' });
		expect(response.status).toBe(402);
		const html = await response.text();
		expect(html).toContain('Your card was declined.');
		expect(readForm(html, session.url!).buttons.map((b) => b.value)).toContain('pay');
		const after = await stripe.checkout.sessions.retrieve(session.id);
		expect(after).toMatchObject({ status: 'open', payment_status: 'unpaid', payment_intent: null });
		const events = await listEvents(fake.base);
		expect(events.filter((e) => e.event.data.object.id === session.id)).toEqual([]);
	});

	test('Cancel redirects to cancel_url and leaves the session open', async () => {
		const session = await stripe.checkout.sessions.create(enrolment);
		const response = await submitForm(session.url!, { card: '', action: 'cancel' });
		expect(response.status).toBe(303);
		expect(response.headers.get('location')).toBe(enrolment.cancel_url);
		expect((await stripe.checkout.sessions.retrieve(session.id)).status).toBe('open');
	});

	describe('a paid session', () => {
		let session: Stripe.Checkout.Session;
		let completed: Delivery;

		beforeAll(async () => {
			session = await stripe.checkout.sessions.create(enrolment);
			const form = readForm(await (await fetch(session.url!)).text(), session.url!);
			const response = await submitForm(form.url, { card: '4242 4242 4242 4242', action: 'pay' });
			expect(response.status).toBe(303);
			expect(response.headers.get('location')).toBe(`http://127.0.0.1:3000/enrol/done?session=${session.id}`);
			[completed] = await receiver.waitFor((d) => d.event.type === 'checkout.session.completed' && d.event.data.object.id === session.id);
		});

		test('is complete and paid, with a succeeded payment intent', async () => {
			const paid = await stripe.checkout.sessions.retrieve(session.id, { expand: ['payment_intent'] });
			expect(paid).toMatchObject({ status: 'complete', payment_status: 'paid' });
			const intent = paid.payment_intent as Stripe.PaymentIntent;
			expect(intent.id).toMatch(/^pi_/);
			expect(intent).toMatchObject({ object: 'payment_intent', amount: 14900, amount_received: 14900, currency: 'usd', status: 'succeeded' });
			expect((await stripe.checkout.sessions.retrieve(session.id)).payment_intent).toBe(intent.id);
			// the `expand[]=` spelling (curl, other clients) as well as the SDK's `expand[0]=`
			const raw = await fetch(`${fake.base}/v1/checkout/sessions/${session.id}?expand[]=payment_intent`, { headers: { Authorization: 'Bearer sk_test_spec' } });
			expect((await raw.json()).payment_intent).toMatchObject({ id: intent.id, object: 'payment_intent' });
		});

		test('sends checkout.session.completed signed so constructEvent verifies it', () => {
			const header = completed.headers['stripe-signature'];
			expect(header).toMatch(/^t=\d+,v1=[0-9a-f]{64}$/);
			expect(completed.headers['content-type']).toMatch(/^application\/json/);
			const event = stripe.webhooks.constructEvent(completed.body, String(header), SECRET);
			expect(event.id).toMatch(/^evt_/);
			expect(event).toMatchObject({ object: 'event', type: 'checkout.session.completed', livemode: false });
			expect(event.api_version).toMatch(/^\d{4}-\d{2}-\d{2}/);
			expect(Math.abs(event.created - Date.now() / 1000)).toBeLessThan(60);
			if (event.type !== 'checkout.session.completed') throw new Error('narrowing');
			expect(event.data.object).toMatchObject({
				id: session.id,
				object: 'checkout.session',
				status: 'complete',
				payment_status: 'paid',
				client_reference_id: 'enrolment-42',
				metadata: { course: 'daylight-flash-for-action', learner: '42' }
			});
			expect(event.data.object.payment_intent).toMatch(/^pi_/);
		});

		test('a wrong secret or an altered body fails constructEvent', () => {
			const header = String(completed.headers['stripe-signature']);
			expect(() => stripe.webhooks.constructEvent(completed.body, header, 'whsec_someone_else')).toThrow(Stripe.errors.StripeSignatureVerificationError);
			const altered = completed.body.replace('"paid"', '"unpaid"');
			expect(altered).not.toBe(completed.body);
			expect(() => stripe.webhooks.constructEvent(altered, header, SECRET)).toThrow(Stripe.errors.StripeSignatureVerificationError);
		});

		test('paying it again charges nothing more and sends no second event', async () => {
			const before = await stripe.checkout.sessions.retrieve(session.id);
			const response = await submitForm(session.url ?? `${fake.base}/pay/${session.id}`, { card: '4242424242424242', action: 'pay' });
			expect(response.status).toBe(303);
			expect((await stripe.checkout.sessions.retrieve(session.id)).payment_intent).toBe(before.payment_intent);
			const events = (await listEvents(fake.base)).filter((e) => e.event.data.object.id === session.id);
			expect(events).toHaveLength(1);
		});

		test('partial then full refund each send a signed charge.refunded; a further refund is refused', async () => {
			const paid = await stripe.checkout.sessions.retrieve(session.id);
			const pi = String(paid.payment_intent);
			const isRefundOf = (d: Delivery) => d.event.type === 'charge.refunded' && d.event.data.object.payment_intent === pi;

			const partial = await stripe.refunds.create({ payment_intent: pi, amount: 4900 });
			expect(partial.id).toMatch(/^re_/);
			expect(partial).toMatchObject({ object: 'refund', amount: 4900, payment_intent: pi, status: 'succeeded', currency: 'usd' });
			expect(await stripe.refunds.retrieve(partial.id)).toEqual(partial);
			const [first] = await receiver.waitFor(isRefundOf);
			const firstEvent = stripe.webhooks.constructEvent(first.body, String(first.headers['stripe-signature']), SECRET);
			expect(firstEvent.type).toBe('charge.refunded');
			expect(firstEvent.data.object).toMatchObject({ object: 'charge', payment_intent: pi, amount: 14900, amount_refunded: 4900, refunded: false });

			await expect(stripe.refunds.create({ payment_intent: pi, amount: 20000 })).rejects.toMatchObject({ statusCode: 400, param: 'amount' });

			const rest = await stripe.refunds.create({ payment_intent: pi });
			expect(rest.amount).toBe(10000);
			const [, second] = await receiver.waitFor(isRefundOf, 2);
			const secondEvent = stripe.webhooks.constructEvent(second.body, String(second.headers['stripe-signature']), SECRET);
			expect(secondEvent.data.object).toMatchObject({ payment_intent: pi, amount_refunded: 14900, refunded: true });

			await expect(stripe.refunds.create({ payment_intent: pi })).rejects.toMatchObject({ statusCode: 400, code: 'charge_already_refunded' });
			await expect(stripe.refunds.create({ payment_intent: 'pi_nothing_here' })).rejects.toMatchObject({
				statusCode: 400,
				code: 'resource_missing',
				param: 'payment_intent'
			});
			await expect(stripe.refunds.retrieve('re_nothing_here')).rejects.toMatchObject({ statusCode: 404 });
		});

		test('redelivery sends the identical event again', async () => {
			const id = completed.event.id;
			const response = await fetch(`${fake.base}/__fake/redeliver/${id}`, { method: 'POST' });
			expect(response.status).toBe(202);
			const both = await receiver.waitFor((d) => d.event.id === id, 2);
			expect(both[1].body).toBe(both[0].body);
			expect(stripe.webhooks.constructEvent(both[1].body, String(both[1].headers['stripe-signature']), SECRET).id).toBe(id);
			expect((await fetch(`${fake.base}/__fake/redeliver/evt_nothing_here`, { method: 'POST' })).status).toBe(404);
		});

		test('a failing endpoint is retried until it answers 2xx, and at most 5 times', async () => {
			const id = completed.event.id;
			const countFor = () => receiver.deliveries.filter((d) => d.event.id === id).length;
			const start = countFor();
			receiver.failNext(2);
			await fetch(`${fake.base}/__fake/redeliver/${id}`, { method: 'POST' });
			await receiver.waitFor((d) => d.event.id === id, start + 3);
			const listed = (await listEvents(fake.base)).find((e) => e.event.id === id);
			expect(listed?.deliveries.slice(-3).map((d) => d.status)).toEqual([500, 500, 200]);

			const next = countFor();
			receiver.failNext(100);
			await fetch(`${fake.base}/__fake/redeliver/${id}`, { method: 'POST' });
			await receiver.waitFor((d) => d.event.id === id, next + 5);
			// the waits double from 20 ms (20+40+80+160); a sixth try would come well within this pause
			await new Promise((r) => setTimeout(r, 16 * RETRY_BASE_MS * 2));
			expect(countFor()).toBe(next + 5);
			receiver.failNext(0);
		});
	});

	test('an idempotency key replays the first session; reused with other params it is refused', async () => {
		const key = `spec-${Date.now()}`;
		const first = await stripe.checkout.sessions.create(enrolment, { idempotencyKey: key });
		const second = await stripe.checkout.sessions.create(enrolment, { idempotencyKey: key });
		expect(second.id).toBe(first.id);
		await expect(stripe.checkout.sessions.create({ ...enrolment, client_reference_id: 'enrolment-43' }, { idempotencyKey: key })).rejects.toMatchObject({
			type: 'StripeIdempotencyError',
			statusCode: 400
		});
	});
});

describe('stripe fake without a webhook URL, keeping state in a file', () => {
	const dir = mkdtempSync(join(tmpdir(), 'stripe-fake-spec-'));
	const file = join(dir, 'state.json');
	afterAll(() => rmSync(dir, { recursive: true, force: true }));

	test('state survives a SIGTERM and restart; events are kept but not sent', async () => {
		const first = await startFake({ STRIPE_FAKE_STATE: file });
		let id: string;
		try {
			const session = await sdk(first.port).checkout.sessions.create(enrolment);
			id = session.id;
			const pay = await submitForm(session.url!, { card: '4242424242424242', action: 'pay' });
			expect(pay.status).toBe(303);
			const [listed] = (await listEvents(first.base)).filter((e) => e.event.data.object.id === id);
			expect(listed.deliveries).toEqual([]);
			expect(listed.event).toMatchObject({ type: 'checkout.session.completed', pending_webhooks: 0 });
			expect((await fetch(`${first.base}/__fake/redeliver/${listed.event.id}`, { method: 'POST' })).status).toBe(409);
		} finally {
			expect(await stopFake(first)).toBe(0);
		}
		expect(existsSync(file)).toBe(true);

		const second = await startFake({ STRIPE_FAKE_STATE: file });
		try {
			const session = await sdk(second.port).checkout.sessions.retrieve(id);
			expect(session).toMatchObject({ id, status: 'complete', payment_status: 'paid' });
		} finally {
			expect(await stopFake(second)).toBe(0);
		}
	});

	test('an unreadable state file stops the start and is left untouched', async () => {
		const broken = join(dir, 'broken.json');
		writeFileSync(broken, '{ not json');
		await expect(startFake({ STRIPE_FAKE_STATE: broken })).rejects.toThrow(/exited with 1: .*cannot read the state file/);
		expect(readFileSync(broken, 'utf8')).toBe('{ not json');
	});
});

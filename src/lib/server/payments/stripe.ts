// The one payment-provider client, from env: the local fake when STRIPE_API_HOST is set, else the real service.
import Stripe from 'stripe';

export type StripeSettings = {
	secretKey: string | null;
	webhookSecret: string | null;
	/** set only when pointing somewhere other than the real service (the fake in fakes/stripe) */
	api: { host: string; port: number; protocol: 'http' | 'https' } | null;
};

/** The fake's default signing secret: only ever trusted when the app talks to the fake. */
const fakeWebhookSecret = 'whsec_stopwise_local';

export function readStripeSettings(env: NodeJS.ProcessEnv = process.env): StripeSettings {
	const host = env.STRIPE_API_HOST?.trim() || null;
	const protocol = env.STRIPE_API_PROTOCOL === 'https' ? 'https' : 'http';
	const api = host ? { host, port: Number(env.STRIPE_API_PORT || (protocol === 'https' ? 443 : 80)), protocol } as const : null;
	return {
		secretKey: env.STRIPE_SECRET_KEY?.trim() || null,
		// a well-known default secret would let anyone forge events against the real service
		webhookSecret: env.STRIPE_WEBHOOK_SECRET?.trim() || (api ? fakeWebhookSecret : null),
		api
	};
}

let cached: { key: string; client: Stripe } | undefined;

/** The SDK client, or null when no secret key is configured (payments then answer "not set up"). */
export function getStripe(): Stripe | null {
	const settings = readStripeSettings();
	if (!settings.secretKey) return null;
	// tests point the env at a fake started on a free port: rebuild when the settings change
	const key = JSON.stringify(settings);
	if (cached?.key === key) return cached.client;
	const client = new Stripe(settings.secretKey, {
		...(settings.api ?? {}),
		// the fake answers at once; against the real service the SDK's own retries (with idempotency keys) help
		maxNetworkRetries: settings.api ? 0 : 2,
		timeout: 20_000,
		telemetry: false
	});
	cached = { key, client };
	return client;
}

/** Signature checks need only the secret, not an API key. */
export const webhooks = Stripe.webhooks;

export function isStripeError(e: unknown): e is InstanceType<typeof Stripe.errors.StripeError> {
	return e instanceof Stripe.errors.StripeError;
}

export type { Stripe };

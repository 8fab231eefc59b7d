// Which service the payment client talks to, decided by env alone; the fake's known secret never guards the real service.
import { describe, expect, test } from 'vitest';
import { readStripeSettings } from './stripe';

describe('readStripeSettings', () => {
	test('no STRIPE_API_HOST: the real service, and no webhook secret unless one is given', () => {
		expect(readStripeSettings({ STRIPE_SECRET_KEY: 'sk_test_abc' })).toEqual({ secretKey: 'sk_test_abc', webhookSecret: null, api: null });
		expect(readStripeSettings({ STRIPE_SECRET_KEY: 'sk_test_abc', STRIPE_WEBHOOK_SECRET: 'whsec_real' }).webhookSecret).toBe('whsec_real');
	});

	test('STRIPE_API_HOST points the SDK at the fake, with its default signing secret', () => {
		const settings = readStripeSettings({ STRIPE_SECRET_KEY: 'sk_test_stopwise_local', STRIPE_API_HOST: '127.0.0.1', STRIPE_API_PORT: '12112', STRIPE_API_PROTOCOL: 'http' });
		expect(settings).toEqual({
			secretKey: 'sk_test_stopwise_local',
			webhookSecret: 'whsec_stopwise_local',
			api: { host: '127.0.0.1', port: 12112, protocol: 'http' }
		});
	});

	test('no key: payments are not configured; blank values count as unset', () => {
		expect(readStripeSettings({}).secretKey).toBeNull();
		expect(readStripeSettings({ STRIPE_SECRET_KEY: '  ', STRIPE_API_HOST: '' })).toEqual({ secretKey: null, webhookSecret: null, api: null });
	});
});

import { describe, expect, test } from 'vitest';
import { describeTransport } from './mail';

describe('describeTransport', () => {
	test('without SMTP_HOST it uses the local fake, without TLS', () => {
		expect(describeTransport({ FAKE_SMTP_PORT: '2600' })).toEqual({ host: '127.0.0.1', port: 2600, secure: false, ignoreTLS: true, fake: true });
		expect(describeTransport({}).port).toBe(2525);
	});

	test('SMTP_* env vars alone configure a real server', () => {
		expect(
			describeTransport({ SMTP_HOST: 'mail.test.example', SMTP_PORT: '2465', SMTP_SECURE: 'true', SMTP_USER: 'u', SMTP_PASS: 'p' })
		).toEqual({ host: 'mail.test.example', port: 2465, secure: true, auth: { user: 'u', pass: 'p' }, fake: false });
		expect(describeTransport({ SMTP_HOST: 'mail.test.example' })).toMatchObject({ port: 587, secure: false, auth: undefined });
	});
});

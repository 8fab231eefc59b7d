// Which store the environment chooses, and the clear errors for settings that cannot work.
import { describe, expect, it } from 'vitest';
import { storageSettings } from './settings';

const s3 = { STOPWISE_STORAGE: 's3', STOPWISE_S3_BUCKET: 'frames' };

describe('storage settings', () => {
	it('is local disk unless s3 is asked for', () => {
		expect(storageSettings({})).toEqual({ kind: 'local' });
		expect(storageSettings({ STOPWISE_STORAGE: '' })).toEqual({ kind: 'local' });
		expect(storageSettings({ STOPWISE_STORAGE: 'local', STOPWISE_S3_BUCKET: 'ignored' })).toEqual({ kind: 'local' });
	});

	it('reads the bucket, endpoint, region and keys; path style follows a custom endpoint unless set', () => {
		expect(
			storageSettings({
				...s3,
				STOPWISE_S3_ENDPOINT: 'http://127.0.0.1:4568',
				STOPWISE_S3_REGION: 'eu-west-1',
				STOPWISE_S3_ACCESS_KEY_ID: 'id',
				STOPWISE_S3_SECRET_ACCESS_KEY: 'secret'
			})
		).toEqual({
			kind: 's3',
			s3: { bucket: 'frames', endpoint: 'http://127.0.0.1:4568', region: 'eu-west-1', accessKeyId: 'id', secretAccessKey: 'secret', forcePathStyle: true }
		});
		const plain = storageSettings(s3);
		expect(plain.kind === 's3' && plain.s3).toMatchObject({ region: 'us-east-1', forcePathStyle: false, endpoint: undefined, accessKeyId: undefined });
		const virtual = storageSettings({ ...s3, STOPWISE_S3_ENDPOINT: 'https://objects.example.test', STOPWISE_S3_PATH_STYLE: 'false' });
		expect(virtual.kind === 's3' && virtual.s3.forcePathStyle).toBe(false);
	});

	it('names the variable that is wrong or missing', () => {
		expect(() => storageSettings({ STOPWISE_STORAGE: 'disk' })).toThrow(/STOPWISE_STORAGE must be "local" or "s3"/);
		expect(() => storageSettings({ STOPWISE_STORAGE: 's3' })).toThrow(/needs STOPWISE_S3_BUCKET/);
		expect(() => storageSettings({ ...s3, STOPWISE_S3_ENDPOINT: '127.0.0.1:4568' })).toThrow(/STOPWISE_S3_ENDPOINT must be an http\(s\) URL/);
		expect(() => storageSettings({ ...s3, STOPWISE_S3_ACCESS_KEY_ID: 'id' })).toThrow(/set both or neither/);
		expect(() => storageSettings({ ...s3, STOPWISE_S3_PATH_STYLE: 'yes' })).toThrow(/STOPWISE_S3_PATH_STYLE/);
	});
});

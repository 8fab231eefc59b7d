// Which file store the environment asks for: STOPWISE_STORAGE=local (the default) or s3 with its STOPWISE_S3_* settings.
import type { S3StoreOptions } from './s3';

export type StorageSettings = { kind: 'local' } | { kind: 's3'; s3: S3StoreOptions };

type Env = Record<string, string | undefined>;

/** Reads the settings; a wrong or missing one throws an error naming the variable, so a node never starts half-configured. */
export function storageSettings(env: Env): StorageSettings {
	const kind = (env.STOPWISE_STORAGE ?? '').trim() || 'local';
	if (kind === 'local') return { kind };
	if (kind !== 's3') throw new Error(`STOPWISE_STORAGE must be "local" or "s3", not ${JSON.stringify(kind)}`);
	const value = (name: string) => env[name]?.trim() || undefined;
	const bucket = value('STOPWISE_S3_BUCKET');
	if (!bucket) throw new Error('STOPWISE_STORAGE=s3 needs STOPWISE_S3_BUCKET');
	const endpoint = value('STOPWISE_S3_ENDPOINT');
	if (endpoint && !/^https?:\/\/[^/]+/.test(endpoint)) throw new Error(`STOPWISE_S3_ENDPOINT must be an http(s) URL, not ${JSON.stringify(endpoint)}`);
	const accessKeyId = value('STOPWISE_S3_ACCESS_KEY_ID');
	const secretAccessKey = value('STOPWISE_S3_SECRET_ACCESS_KEY');
	if (Boolean(accessKeyId) !== Boolean(secretAccessKey)) {
		throw new Error('STOPWISE_S3_ACCESS_KEY_ID and STOPWISE_S3_SECRET_ACCESS_KEY go together: set both or neither');
	}
	const pathStyle = value('STOPWISE_S3_PATH_STYLE');
	if (pathStyle && !['true', 'false'].includes(pathStyle)) throw new Error('STOPWISE_S3_PATH_STYLE must be "true" or "false"');
	return {
		kind: 's3',
		s3: {
			bucket,
			endpoint,
			region: value('STOPWISE_S3_REGION') ?? 'us-east-1',
			accessKeyId,
			secretAccessKey,
			// a custom endpoint (the fake, most self-hosted services) usually wants bucket names in the path
			forcePathStyle: pathStyle ? pathStyle === 'true' : Boolean(endpoint)
		}
	};
}

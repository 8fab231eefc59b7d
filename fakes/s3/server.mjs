// Fake S3 for development: s3rver serving one bucket from a folder, only when the app is set to STOPWISE_STORAGE=s3
// and STOPWISE_S3_ENDPOINT is unset or this fake's own address. Knows nothing of the app. Env: FAKE_S3_PORT (default 4568),
// FAKE_S3_DIR (default .data/s3), STOPWISE_S3_BUCKET (default stopwise, created on start). Clients sign with the key id
// and secret S3RVER and address it path-style (http://127.0.0.1:<port>/<bucket>/<key>).
import { mkdir } from 'node:fs/promises';
import { join, resolve } from 'node:path';

const port = Number(process.env.FAKE_S3_PORT ?? 4568);
const endpoint = process.env.STOPWISE_S3_ENDPOINT?.replace(/\/+$/, '');
if (process.env.STOPWISE_STORAGE !== 's3' || (endpoint && endpoint !== `http://127.0.0.1:${port}`)) {
	// local disk (the default) or a real bucket: nothing to serve, and s3rver is not even loaded
	console.log(`ready (not needed: ${process.env.STOPWISE_STORAGE === 's3' ? 'the app uses another endpoint' : 'STOPWISE_STORAGE is not s3'})`);
	process.exit(0);
}

const { default: S3rver } = await import('s3rver');
const { addMultipartCalls } = await import('./multipart.mjs');
const dir = resolve(process.env.FAKE_S3_DIR ?? join('.data', 's3'));
const bucket = process.env.STOPWISE_S3_BUCKET || 'stopwise';

await mkdir(dir, { recursive: true });
// with ListParts and AbortMultipartUpload added: frames in transit are multipart uploads kept in the bucket
const server = addMultipartCalls(new S3rver({ address: '127.0.0.1', port, silent: true, directory: dir, configureBuckets: [{ name: bucket, configs: [] }] }));
// s3rver reports a failed listen (e.g. the port is taken) as an unhandled 'error' event: say it in one line and fail fast
const failToStart = (e) => {
	console.error('fake s3:', e.message);
	process.exit(1);
};
process.once('uncaughtException', failToStart);
await server.run().catch(failToStart);
process.off('uncaughtException', failToStart);
console.log(`ready: fake S3 on 127.0.0.1:${port}, bucket ${bucket}, data ${dir}`);

const stop = () => server.close().then(() => process.exit(0));
process.on('SIGTERM', stop);
process.on('SIGINT', stop);

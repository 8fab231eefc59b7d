// The app on the S3 backend: an attempt's files land in the bucket, are served streamed with the same access checks,
// and the sweep and attempt removal clear the bucket. The bucket is an s3rver this file starts on a free port.
import { randomUUID } from 'node:crypto';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import S3rver from 's3rver';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { frameKeys } from '$lib/server/attempts/keys';
import { closeQueue, GRADE_QUEUE, openQueue } from '$lib/server/attempts/queue';
import { submitAttempt } from '$lib/server/attempts/submit';
import { readUploadForm } from '$lib/server/attempts/upload-form';
import { sweepUploads } from '$lib/server/attempts/uploads/sweep';
import { createS3Store, useFileStore, type FileStore } from '$lib/server/storage';
import { GET as getFile } from '../../src/routes/files/attempts/[id]/[frame]/[variant]/+server';
import { makeEvent, throughHooks, type TestCookies } from './support/request-event';
import { freshLearner, removeFreshPeople, signedInCookies } from './support/people';
import { ASSIGNMENT, attemptIdsOf, enrol, key, passingPair, removeAttempts, uploadData } from './support/attempts';

const BUCKET = 'stopwise-app';
let dir: string;
let server: S3rver;
let bucket: FileStore;
let previous: FileStore;
let owner: Awaited<ReturnType<typeof freshLearner>>;
let other: Awaited<ReturnType<typeof freshLearner>>;
let pair: { reference: Buffer; lit: Buffer };

async function fetchFile(cookies: TestCookies | undefined, id: string, frame: string, variant: string) {
	const path = `/files/attempts/${id}/${encodeURIComponent(frame)}/${variant}`;
	const outcome = await throughHooks(makeEvent({ path, cookies, params: { id, frame, variant } }), (e) => getFile(e as never));
	return (outcome as { value: Response }).value;
}

beforeAll(async () => {
	dir = await mkdtemp(join(tmpdir(), 'stopwise-s3-app-'));
	server = new S3rver({ address: '127.0.0.1', port: 0, silent: true, directory: dir, configureBuckets: [{ name: BUCKET, configs: [] }] });
	const { port } = (await server.run()) as unknown as { port: number };
	bucket = createS3Store({ bucket: BUCKET, endpoint: `http://127.0.0.1:${port}`, region: 'us-east-1', accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER', forcePathStyle: true });
	previous = useFileStore(bucket);
	await openQueue();
	owner = await freshLearner();
	other = await freshLearner();
	await enrol(owner.id);
	pair = await passingPair({ width: 600, height: 400 });
}, 60_000);

afterAll(async () => {
	await removeAttempts(await attemptIdsOf(owner.id));
	await removeFreshPeople();
	await closeQueue();
	useFileStore(previous);
	await server.close();
	await rm(dir, { recursive: true, force: true });
});

describe('the S3 backend in the app', () => {
	test('an attempt stores every file in the bucket, served streamed to its owner only; removing it empties its folder', async () => {
		const form = readUploadForm(uploadData({ assignment: ASSIGNMENT, submissionKey: key() }, pair));
		if (!form.ok) throw new Error(form.message);
		const made = await submitAttempt({ id: owner.id, roles: ['learner'] }, form.form);
		if (made.kind !== 'created') throw new Error(made.kind);
		await (await openQueue()).deleteJob(GRADE_QUEUE, made.id);

		const folders = (await bucket.listFolders('attempts')).map((f) => f.name);
		expect(folders).toContain(made.id);
		for (const index of [0, 1]) {
			const keys = frameKeys(made.id, index, 'jpeg');
			for (const k of Object.values(keys)) expect(await bucket.get(k), k).not.toBeNull();
		}

		const mine = await signedInCookies(owner.email);
		const original = await fetchFile(mine, made.id, 'lit', 'original');
		expect(original.status).toBe(200);
		expect(original.headers.get('content-length')).toBe(String(pair.lit.length));
		// the body is the stream from the bucket, passed on as it arrives
		expect(original.body).toBeInstanceOf(ReadableStream);
		expect(Buffer.from(await original.arrayBuffer()).equals(pair.lit)).toBe(true);
		const large = await fetchFile(mine, made.id, 'reference', 'large');
		expect(large.status).toBe(200);
		expect(Buffer.from(await large.arrayBuffer()).subarray(8, 12).toString()).toBe('WEBP');

		// the same answers as on disk for people who may not see it
		expect((await fetchFile(await signedInCookies(other.email), made.id, 'lit', 'original')).status).toBe(404);
		expect((await fetchFile(undefined, made.id, 'lit', 'original')).status).toBe(401);

		await removeAttempts([made.id]);
		expect((await bucket.listFolders('attempts')).map((f) => f.name)).not.toContain(made.id);
		expect(await bucket.get(frameKeys(made.id, 0, 'jpeg').originalKey)).toBeNull();
	});

	test('the sweep removes attempt folders in the bucket that no attempt owns, and keeps owned ones', async () => {
		const form = readUploadForm(uploadData({ assignment: ASSIGNMENT, submissionKey: key() }, pair));
		if (!form.ok) throw new Error(form.message);
		const made = await submitAttempt({ id: owner.id, roles: ['learner'] }, form.form);
		if (made.kind !== 'created') throw new Error(made.kind);
		await (await openQueue()).deleteJob(GRADE_QUEUE, made.id);
		const orphan = randomUUID();
		await bucket.put(frameKeys(orphan, 0, 'jpeg').originalKey, Buffer.from('left by a crash'));

		// an object's time cannot be set back, so the sweep is run as if two hours had passed
		const report = await sweepUploads(new Date(Date.now() + 2 * 3600_000));
		expect(report.orphanAttemptFolders).toBeGreaterThanOrEqual(1);
		const left = (await bucket.listFolders('attempts')).map((f) => f.name);
		expect(left).not.toContain(orphan);
		expect(left).toContain(made.id);
	});
});

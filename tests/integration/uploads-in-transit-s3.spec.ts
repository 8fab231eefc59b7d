// Frames in transit kept in the bucket (STOPWISE_STORAGE=s3), shared by every node: parts of any size arrive as S3
// multipart uploads, a part cut off mid-way keeps what arrived, the attempt is made from the finished uploads read
// through a temporary file, and nothing of the uploads stays in the bucket afterwards (made, cancelled or swept). The
// bucket is an s3rver (with the fake's multipart additions) this file starts on a free port.
import { existsSync } from 'node:fs';
import { mkdir, mkdtemp, readdir, rm, utimes, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { ListObjectsCommand, S3Client } from '@aws-sdk/client-s3';
import S3rver from 's3rver';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { attemptFrames, frameUploads } from '$lib/server/db/schema';
import { closeQueue, GRADE_QUEUE, openQueue } from '$lib/server/attempts/queue';
import { uploadDir } from '$lib/server/attempts/uploads/folder';
import { useUploadsInTransit, type UploadsInTransit } from '$lib/server/attempts/uploads/in-transit';
import { createS3Uploads } from '$lib/server/attempts/uploads/in-transit-s3';
import { padJpeg } from '$lib/server/attempts/uploads/padded-jpeg';
import { sweepTemporaryFiles, sweepUploads } from '$lib/server/attempts/uploads/sweep';
import { createS3Store, s3ClientConfig, type S3StoreOptions } from '$lib/server/storage/s3';
import { useFileStore, type FileStore } from '$lib/server/storage';
import { UPLOAD_PART_BYTES } from '$lib/attempts/upload-parts';
import { addMultipartCalls } from '../../fakes/s3/multipart.mjs';
import { freshLearner, removeFreshPeople, signedInCookies } from './support/people';
import { attemptIdsOf, enrol, key, passingPair, removeAttempts } from './support/attempts';
import { finishAttempt, idOf, sendParts, start, tus, uploadFrame } from './support/tus';
import type { TestCookies } from './support/request-event';

const BUCKET = 'stopwise-transit';
const MiB = 1024 * 1024;
let dir: string;
let server: S3rver;
let options: S3StoreOptions;
let bucket: FileStore;
let listing: S3Client;
let previous: { store: FileStore; uploads: UploadsInTransit };
let learner: Awaited<ReturnType<typeof freshLearner>>;
let mine: TestCookies;
let pair: { reference: Buffer; lit: Buffer };

/** Every key at the bucket's top level (where uploads in transit live; attempts and clips are under their folders). */
async function topLevelKeys(): Promise<string[]> {
	const page = await listing.send(new ListObjectsCommand({ Bucket: BUCKET, Delimiter: '/' }));
	return (page.Contents ?? []).map((o) => o.Key!).sort();
}

const keysOf = async (id: string) => (await topLevelKeys()).filter((k) => k.startsWith(id));
const copiesLeft = async () => (await readdir(uploadDir()).catch(() => [] as string[])).filter((n) => n.startsWith('copy-'));

beforeAll(async () => {
	dir = await mkdtemp(join(tmpdir(), 'stopwise-s3-transit-'));
	server = addMultipartCalls(new S3rver({ address: '127.0.0.1', port: 0, silent: true, directory: dir, configureBuckets: [{ name: BUCKET, configs: [] }] }));
	const { port } = (await server.run()) as unknown as { port: number };
	options = { bucket: BUCKET, endpoint: `http://127.0.0.1:${port}`, region: 'us-east-1', accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER', forcePathStyle: true };
	bucket = createS3Store(options);
	listing = new S3Client(s3ClientConfig(options));
	previous = { store: useFileStore(bucket), uploads: useUploadsInTransit(createS3Uploads(options)) };
	await openQueue();
	learner = await freshLearner();
	await enrol(learner.id);
	mine = await signedInCookies(learner.email);
	pair = await passingPair();
}, 60_000);

afterAll(async () => {
	await removeAttempts(await attemptIdsOf(learner.id));
	await removeFreshPeople();
	await closeQueue();
	useFileStore(previous.store);
	useUploadsInTransit(previous.uploads);
	listing.destroy();
	await server.close();
	await rm(dir, { recursive: true, force: true });
});

describe('frames in transit in the bucket', () => {
	test('frames sent in small parts make one attempt with the same bytes; nothing of the uploads stays in the bucket or on disk', async () => {
		const submission = key();
		const reference = await uploadFrame(mine, 'reference', pair.reference, submission);
		// parts far under S3's 5 MiB minimum wait in `<id>.part` until the next one, and the upload stays open
		const litStart = await start(mine, 'lit', pair.lit.length, submission);
		const lit = litStart.headers.get('location')!;
		const half = Math.floor(pair.lit.length / 2);
		await sendParts(mine, lit, pair.lit.subarray(0, half), 16 * 1024);
		expect(await keysOf(idOf(lit))).toEqual([`${idOf(lit)}.info`, `${idOf(lit)}.part`]);
		expect(await sendParts(mine, lit, pair.lit, 16 * 1024, half)).toBe(pair.lit.length);
		// finished: the whole object is there
		expect(await keysOf(idOf(lit))).toEqual([idOf(lit), `${idOf(lit)}.info`]);

		const made = await finishAttempt(mine, submission);
		expect(made.status).toBe(201);
		await (await openQueue()).deleteJob(GRADE_QUEUE, made.body.id);
		const frames = await db.select().from(attemptFrames).where(eq(attemptFrames.attemptId, made.body.id));
		for (const f of frames) expect((await bucket.get(f.originalKey))?.equals(f.name === 'lit' ? pair.lit : pair.reference), f.name).toBe(true);
		expect(await keysOf(idOf(reference))).toEqual([]);
		expect(await keysOf(idOf(lit))).toEqual([]);
		expect(await copiesLeft()).toEqual([]);
	});

	test('a large frame goes in S3 parts of the browser’s size; a part cut off mid-way keeps what arrived and resumes from there', async () => {
		const submission = key();
		const big = padJpeg(pair.lit, UPLOAD_PART_BYTES + 3 * MiB);
		const created = await start(mine, 'lit', big.length, submission);
		const location = created.headers.get('location')!;
		expect(await sendParts(mine, location, big.subarray(0, UPLOAD_PART_BYTES), UPLOAD_PART_BYTES)).toBe(UPLOAD_PART_BYTES);
		// a whole part became an S3 part: nothing waits in `.part`
		expect(await keysOf(idOf(location))).toEqual([`${idOf(location)}.info`]);

		// the connection drops after one more MiB has reached the server
		const cut = new ReadableStream<Uint8Array>({
			start: (controller) => controller.enqueue(new Uint8Array(big.subarray(UPLOAD_PART_BYTES, UPLOAD_PART_BYTES + MiB))),
			pull: (controller) => controller.error(new Error('connection reset'))
		});
		await tus('PATCH', location, mine, { 'upload-offset': String(UPLOAD_PART_BYTES), 'content-type': 'application/offset+octet-stream' }, cut);
		const head = await tus('HEAD', location, mine, {});
		expect(head.status).toBe(200);
		expect(Number(head.headers.get('upload-offset'))).toBe(UPLOAD_PART_BYTES + MiB);

		expect(await sendParts(mine, location, big, UPLOAD_PART_BYTES, UPLOAD_PART_BYTES + MiB)).toBe(big.length);
		await uploadFrame(mine, 'reference', pair.reference, submission);
		const made = await finishAttempt(mine, submission);
		expect(made.status).toBe(201);
		await (await openQueue()).deleteJob(GRADE_QUEUE, made.body.id);
		const [lit] = (await db.select().from(attemptFrames).where(eq(attemptFrames.attemptId, made.body.id))).filter((f) => f.name === 'lit');
		expect((await bucket.get(lit.originalKey))?.equals(big)).toBe(true);
		expect(await keysOf(idOf(location))).toEqual([]);
	});

	test('cancelling removes the upload, its parts and its cut part from the bucket', async () => {
		const created = await start(mine, 'lit', pair.lit.length, key());
		const location = created.headers.get('location')!;
		await sendParts(mine, location, pair.lit.subarray(0, 1000), 1000);
		expect(await keysOf(idOf(location))).toHaveLength(2);
		expect((await tus('DELETE', location, mine, {})).status).toBe(204);
		expect(await keysOf(idOf(location))).toEqual([]);
		expect((await tus('HEAD', location, mine, {})).status).toBe(404);
	});

	test('the sweep removes bytes in the bucket that no upload row owns, and keeps those that one does', async () => {
		const owned = idOf((await start(mine, 'reference', 1000, key())).headers.get('location')!);
		const stray = idOf((await start(mine, 'lit', 1000, key())).headers.get('location')!);
		await sendParts(mine, `/api/v1/uploads/${stray}`, pair.lit.subarray(0, 500), 500);
		// its row gone, as after a crash or a removed learner
		await db.delete(frameUploads).where(eq(frameUploads.id, stray));
		const report = await sweepUploads(new Date(Date.now() + 2 * 3600_000));
		expect(report.strayFiles).toBeGreaterThanOrEqual(1);
		expect(await keysOf(stray)).toEqual([]);
		expect(await keysOf(owned)).toEqual([`${owned}.info`]);
		expect(existsSync(join(uploadDir(), owned))).toBe(false);
	});

	test('a copy left on this node by a crash is swept once old (at app start and by the sweep); a fresh one is kept', async () => {
		await mkdir(uploadDir(), { recursive: true });
		const old = join(uploadDir(), `copy-${'cd'.repeat(16)}-crashed`);
		const fresh = join(uploadDir(), `copy-${'ef'.repeat(16)}-reading`);
		await writeFile(old, 'bytes');
		await writeFile(fresh, 'bytes');
		const hoursAgo = new Date(Date.now() - 2 * 3600_000);
		await utimes(old, hoursAgo, hoursAgo);
		expect(await sweepTemporaryFiles()).toBeGreaterThanOrEqual(1);
		expect(existsSync(old)).toBe(false);
		expect(existsSync(fresh)).toBe(true);
		await rm(fresh);
	});
});

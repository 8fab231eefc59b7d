// One contract for every FileStore backend: local disk, and S3 against an s3rver this file starts on a free port.
import { createHash, randomBytes, randomUUID } from 'node:crypto';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import S3rver from 's3rver';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { frameKeys } from '../attempts/keys';
import { createLocalDiskStore } from './local-disk';
import { createS3Store } from './s3';
import type { FileStore } from './store';

const BUCKET = 'stopwise-contract';

interface Backend {
	name: string;
	/** A fresh, empty store for one test. */
	make(): FileStore;
	start(): Promise<void>;
	stop(): Promise<void>;
}

function localBackend(): Backend {
	let root = '';
	const roots: string[] = [];
	return {
		name: 'local disk',
		async start() {
			root = await mkdtemp(join(tmpdir(), 'stopwise-contract-disk-'));
		},
		make() {
			const dir = join(root, `store-${roots.length}`);
			roots.push(dir);
			return createLocalDiskStore(dir);
		},
		async stop() {
			await rm(root, { recursive: true, force: true });
		}
	};
}

function s3Backend(): Backend {
	let dir = '';
	let server: S3rver | undefined;
	let endpoint = '';
	return {
		name: 's3 (s3rver)',
		async start() {
			dir = await mkdtemp(join(tmpdir(), 'stopwise-contract-s3-'));
			// port 0: the system picks a free one, so the test needs no configuration and clashes with nothing
			server = new S3rver({ address: '127.0.0.1', port: 0, silent: true, directory: dir, configureBuckets: [{ name: BUCKET, configs: [] }] });
			const { port } = (await server.run()) as unknown as { port: number };
			endpoint = `http://127.0.0.1:${port}`;
		},
		make() {
			// one bucket for the file: each test writes under its own fresh attempt id, so tests never meet
			return createS3Store({ bucket: BUCKET, endpoint, region: 'us-east-1', accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER', forcePathStyle: true });
		},
		async stop() {
			await server?.close();
			await rm(dir, { recursive: true, force: true });
		}
	};
}

/** Reads a stream chunk by chunk without keeping the chunks: the digest, the length and how many chunks came. */
async function digestOf(body: ReadableStream<Uint8Array>) {
	const hash = createHash('sha256');
	let length = 0;
	let chunks = 0;
	let largest = 0;
	for await (const chunk of body as unknown as AsyncIterable<Uint8Array>) {
		hash.update(chunk);
		length += chunk.byteLength;
		largest = Math.max(largest, chunk.byteLength);
		chunks++;
	}
	return { digest: hash.digest('hex'), length, chunks, largest };
}

const sha256 = (data: Uint8Array) => createHash('sha256').update(data).digest('hex');

for (const backend of [localBackend(), s3Backend()]) {
	describe(`file store contract: ${backend.name}`, () => {
		let store: FileStore;
		// keys of the project's real shapes; each test uses a fresh attempt id so tests on the shared bucket never meet
		let attemptId: string;
		beforeAll(() => backend.start(), 30_000);
		afterAll(() => backend.stop());
		beforeEach(() => {
			store = backend.make();
			attemptId = randomUUID();
		});

		it('stores binary data and reads back the same bytes, under every key shape the app writes', async () => {
			const every = Buffer.from(Array.from({ length: 256 }, (_, i) => i));
			const jpeg = frameKeys(attemptId, 0, 'jpeg');
			const dng = frameKeys(attemptId, 1, 'raw', 'raw (DNG)');
			const heic = frameKeys(attemptId, 2, 'heic');
			const keys = [
				jpeg.originalKey,
				jpeg.largeKey,
				jpeg.thumbKey,
				dng.originalKey,
				heic.originalKey,
				`lesson-images/${randomBytes(10).toString('hex')}.webp`
			];
			expect(dng.originalKey).toMatch(/\/1-original\.dng$/);
			for (const [i, key] of keys.entries()) await store.put(key, Buffer.concat([every, Buffer.from([i])]));
			for (const [i, key] of keys.entries()) {
				const back = await store.get(key);
				expect(back, key).toBeInstanceOf(Buffer);
				expect(back?.equals(Buffer.concat([every, Buffer.from([i])])), key).toBe(true);
			}
		});

		it('an empty value is stored and read back as empty, not as missing', async () => {
			const key = `attempts/${attemptId}/0-thumb.webp`;
			await store.put(key, new Uint8Array(0));
			expect((await store.get(key))?.length).toBe(0);
			expect((await store.open(key))?.size).toBe(0);
		});

		it('a second put replaces the whole value', async () => {
			const key = `attempts/${attemptId}/0-large.webp`;
			await store.put(key, randomBytes(50_000));
			await store.put(key, Buffer.from('short'));
			expect((await store.get(key))?.toString()).toBe('short');
		});

		it('streams a large object in many chunks with its size, the bytes unchanged', async () => {
			const key = `attempts/${attemptId}/0-original.jpg`;
			const big = randomBytes(24 * 1024 * 1024 + 17);
			await store.put(key, big);
			const opened = await store.open(key);
			expect(opened?.size).toBe(big.length);
			const read = await digestOf(opened!.body);
			expect(read.length).toBe(big.length);
			expect(read.digest).toBe(sha256(big));
			// served piece by piece: no one chunk holds more than a small part of the file
			expect(read.chunks).toBeGreaterThan(8);
			expect(read.largest).toBeLessThan(big.length / 8);
		});

		it('a stream that is cancelled part-way leaves the value readable', async () => {
			const key = `attempts/${attemptId}/1-original.jpg`;
			const data = randomBytes(4 * 1024 * 1024);
			await store.put(key, data);
			const opened = await store.open(key);
			const reader = opened!.body.getReader();
			expect((await reader.read()).done).toBe(false);
			await reader.cancel();
			expect(sha256((await store.get(key))!)).toBe(sha256(data));
		});

		it('reads a byte range: the first byte, a middle part, the last byte, and a range running past the end', async () => {
			const key = `clips/${attemptId}/720.mp4`;
			const data = randomBytes(3 * 1024 * 1024 + 5);
			await store.put(key, data);
			const read = async (start: number, end: number) => {
				const opened = await store.openRange(key, start, end);
				const chunks: Uint8Array[] = [];
				for await (const chunk of opened!.body as unknown as AsyncIterable<Uint8Array>) chunks.push(chunk);
				return { size: opened!.size, bytes: Buffer.concat(chunks) };
			};
			expect(await read(0, 0)).toEqual({ size: 1, bytes: data.subarray(0, 1) });
			const middle = await read(1_000_000, 2_000_000);
			expect(middle.size).toBe(1_000_001);
			expect(sha256(middle.bytes)).toBe(sha256(data.subarray(1_000_000, 2_000_001)));
			expect(await read(data.length - 1, data.length - 1)).toEqual({ size: 1, bytes: data.subarray(data.length - 1) });
			const tail = await read(data.length - 10, data.length + 100);
			expect(tail.bytes.equals(data.subarray(data.length - 10))).toBe(true);
			expect(tail.size).toBe(10);
			expect(await store.openRange(`clips/${attemptId}/360.mp4`, 0, 9)).toBeNull();
			await expect(store.openRange(key, 5, 4)).rejects.toThrow(RangeError);
			await store.deletePrefix(`clips/${attemptId}`);
		});

		it('a missing key reads as null, opens as null, and deletes quietly', async () => {
			const key = `attempts/${attemptId}/0-original.jpg`;
			expect(await store.get(key)).toBeNull();
			expect(await store.open(key)).toBeNull();
			await store.delete(key);
			await store.deletePrefix(`attempts/${attemptId}`);
			expect(await store.listFolders(`never-${attemptId}`)).toEqual([]);
		});

		it('deletes one key and leaves its neighbours', async () => {
			const keys = frameKeys(attemptId, 0, 'png');
			await store.put(keys.originalKey, Buffer.from('o'));
			await store.put(keys.largeKey, Buffer.from('l'));
			await store.delete(keys.originalKey);
			expect(await store.get(keys.originalKey)).toBeNull();
			expect((await store.get(keys.largeKey))?.toString()).toBe('l');
		});

		it('deletes a whole folder by prefix, and not a folder whose name only starts the same', async () => {
			const other = `${attemptId}0`;
			for (const i of [0, 1]) for (const key of Object.values(frameKeys(attemptId, i, 'jpeg'))) await store.put(key, Buffer.from(key));
			await store.put(frameKeys(other, 0, 'jpeg').originalKey, Buffer.from('kept'));
			await store.deletePrefix(`attempts/${attemptId}`);
			for (const i of [0, 1]) for (const key of Object.values(frameKeys(attemptId, i, 'jpeg'))) expect(await store.get(key), key).toBeNull();
			expect((await store.get(frameKeys(other, 0, 'jpeg').originalKey))?.toString()).toBe('kept');
			expect((await store.listFolders('attempts')).map((f) => f.name)).not.toContain(attemptId);
			await store.deletePrefix(`attempts/${other}`);
		});

		it('deletes a folder of more keys than one page of a listing', async () => {
			const keys = Array.from({ length: 1105 }, (_, i) => `attempts/${attemptId}/${i}-thumb.webp`);
			for (let i = 0; i < keys.length; i += 50) await Promise.all(keys.slice(i, i + 50).map((k) => store.put(k, Buffer.from('x'))));
			await store.deletePrefix(`attempts/${attemptId}`);
			expect(await store.get(keys[0])).toBeNull();
			expect(await store.get(keys.at(-1)!)).toBeNull();
			expect((await store.listFolders('attempts')).map((f) => f.name)).not.toContain(attemptId);
		}, 120_000);

		it('lists the folders directly under a prefix with when each was last written; loose files are not folders', async () => {
			const root = `sweep-${attemptId}`;
			const before = Date.now();
			await store.put(`${root}/x/0-large.webp`, Buffer.from('1'));
			await store.put(`${root}/x/deeper/1-large.webp`, Buffer.from('2'));
			await store.put(`${root}/y/0-large.webp`, Buffer.from('3'));
			await store.put(`${root}/loose.bin`, Buffer.from('4'));
			const listed = await store.listFolders(root);
			expect(listed.map((f) => f.name).sort()).toEqual(['x', 'y']);
			for (const f of listed) {
				expect(f.modifiedAt).toBeInstanceOf(Date);
				// S3 keeps whole seconds; the disk's clock and ours agree within a minute
				expect(Math.abs(f.modifiedAt.getTime() - before)).toBeLessThan(60_000);
			}
			await store.deletePrefix(root);
			expect(await store.listFolders(root)).toEqual([]);
		});

		it('refuses keys that could leave the store, before touching it', async () => {
			for (const bad of ['../etc/passwd', 'a/../../b', '/abs', 'a//b', 'a/.hidden']) {
				await expect(store.put(bad, Buffer.from('x')), bad).rejects.toThrow(RangeError);
				await expect(store.get(bad), bad).rejects.toThrow(RangeError);
				await expect(store.open(bad), bad).rejects.toThrow(RangeError);
				await expect(store.openRange(bad, 0, 1), bad).rejects.toThrow(RangeError);
				await expect(store.deletePrefix(bad), bad).rejects.toThrow(RangeError);
			}
		});
	});
}

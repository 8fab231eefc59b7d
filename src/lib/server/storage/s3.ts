// FileStore in an S3-compatible bucket through @aws-sdk/client-s3: one object per key, prefixes as folders.
import {
	DeleteObjectCommand,
	DeleteObjectsCommand,
	GetObjectCommand,
	ListObjectsCommand,
	PutObjectCommand,
	S3Client,
	type S3ClientConfig,
	type _Object
} from '@aws-sdk/client-s3';
import { checkKey, checkRange, type FileStore } from './store';

export interface S3StoreOptions {
	bucket: string;
	/** Leave out for the provider's own endpoint; set for an S3-compatible service or the local fake. */
	endpoint?: string;
	region: string;
	/** Both or neither; without them the SDK's own chain (environment, profile, instance role) is used. */
	accessKeyId?: string;
	secretAccessKey?: string;
	/** `http://host/bucket/key` instead of `http://bucket.host/key`: what the fake and most self-hosted services need. */
	forcePathStyle: boolean;
}

/** Errors the SDK raises for a key with nothing under it. */
function isMissing(error: unknown): boolean {
	const e = error as { name?: string; $metadata?: { httpStatusCode?: number } };
	return e?.name === 'NoSuchKey' || e?.name === 'NotFound' || e?.$metadata?.httpStatusCode === 404;
}

/** The `length` bytes after the first `skip` of a stream; the rest of the source is cancelled, not read. */
function sliceStream(source: ReadableStream<Uint8Array>, skip: number, length: number): ReadableStream<Uint8Array> {
	const reader = source.getReader();
	let toSkip = skip;
	let left = length;
	return new ReadableStream<Uint8Array>({
		async pull(controller) {
			for (;;) {
				if (left <= 0) {
					controller.close();
					await reader.cancel().catch(() => undefined);
					return;
				}
				const { done, value } = await reader.read();
				if (done) return controller.close();
				let chunk = value;
				if (toSkip > 0) {
					const dropped = Math.min(toSkip, chunk.byteLength);
					toSkip -= dropped;
					chunk = chunk.subarray(dropped);
				}
				if (chunk.byteLength === 0) continue;
				if (chunk.byteLength > left) chunk = chunk.subarray(0, left);
				left -= chunk.byteLength;
				controller.enqueue(chunk);
				return;
			}
		},
		cancel: (reason) => reader.cancel(reason)
	});
}

/** The SDK client's settings for these options (the file store and the uploads in transit use the same). */
export function s3ClientConfig(options: S3StoreOptions): S3ClientConfig {
	return {
		region: options.region,
		endpoint: options.endpoint,
		forcePathStyle: options.forcePathStyle,
		credentials:
			options.accessKeyId && options.secretAccessKey ? { accessKeyId: options.accessKeyId, secretAccessKey: options.secretAccessKey } : undefined,
		// checksums only where the API demands them: S3-compatible services (the fake among them) do not all know the newer headers
		requestChecksumCalculation: 'WHEN_REQUIRED',
		responseChecksumValidation: 'WHEN_REQUIRED'
	};
}

export function createS3Store(options: S3StoreOptions): FileStore {
	const client = new S3Client(s3ClientConfig(options));
	const Bucket = options.bucket;
	const keyOf = (key: string) => checkKey(key).join('/');

	async function getObject(key: string, Range?: string) {
		try {
			return await client.send(new GetObjectCommand({ Bucket, Key: keyOf(key), Range }));
		} catch (error) {
			if (isMissing(error)) return null;
			throw error;
		}
	}

	/**
	 * Every object whose key starts with `prefix`, page by page (1000 a page). The first version of the listing, paged by
	 * the last key seen: every S3-compatible service has it, and the fake's continuation tokens need a cipher Node's
	 * OpenSSL 3 no longer offers.
	 */
	async function* objectsUnder(prefix: string): AsyncGenerator<_Object> {
		let Marker: string | undefined;
		for (;;) {
			const page = await client.send(new ListObjectsCommand({ Bucket, Prefix: prefix, Marker }));
			const objects = page.Contents ?? [];
			yield* objects;
			Marker = objects.at(-1)?.Key;
			if (!page.IsTruncated || !Marker) return;
		}
	}

	async function deleteKeys(keys: string[]) {
		if (keys.length === 0) return;
		const answer = await client.send(new DeleteObjectsCommand({ Bucket, Delete: { Objects: keys.map((Key) => ({ Key })), Quiet: true } }));
		const failed = (answer.Errors ?? []).filter((e) => e.Code !== 'NoSuchKey');
		if (failed.length > 0) throw new Error(`could not delete ${failed.length} object(s), first ${failed[0].Key}: ${failed[0].Code} ${failed[0].Message ?? ''}`);
	}

	return {
		async put(key, data) {
			// an object appears whole when the PUT completes: readers never see part of it
			await client.send(new PutObjectCommand({ Bucket, Key: keyOf(key), Body: data, ContentLength: data.byteLength }));
		},
		async get(key) {
			const answer = await getObject(key);
			if (!answer?.Body) return null;
			return Buffer.from(await answer.Body.transformToByteArray());
		},
		async open(key) {
			const answer = await getObject(key);
			if (!answer?.Body) return null;
			return { body: answer.Body.transformToWebStream() as ReadableStream<Uint8Array>, size: answer.ContentLength ?? 0 };
		},
		async openRange(key, start, end) {
			checkRange(start, end);
			const answer = await getObject(key, `bytes=${start}-${end}`);
			if (!answer?.Body) return null;
			// a service that ignored the Range (200, no Content-Range) sent the whole value; one that mishandled an end of 0
			// (the fake does) sent too much: either way only the asked bytes leave here
			const skip = answer.ContentRange ? 0 : start;
			const size = Math.max(0, Math.min(end - start + 1, (answer.ContentLength ?? 0) - skip));
			return { body: sliceStream(answer.Body.transformToWebStream() as ReadableStream<Uint8Array>, skip, size), size };
		},
		async delete(key) {
			// S3 answers a delete of a missing key with success
			await client.send(new DeleteObjectCommand({ Bucket, Key: keyOf(key) }));
		},
		async deletePrefix(prefix) {
			const folder = keyOf(prefix);
			// like removing a folder on disk: the key itself if it is an object, and everything under `prefix/`
			let batch: string[] = [folder];
			for await (const object of objectsUnder(`${folder}/`)) {
				if (!object.Key) continue;
				batch.push(object.Key);
				if (batch.length === 1000) {
					await deleteKeys(batch);
					batch = [];
				}
			}
			await deleteKeys(batch);
		},
		async listFolders(prefix) {
			const base = `${keyOf(prefix)}/`;
			// a bucket has no folders: a folder is the first segment of keys below `prefix/`, last written when its newest object was
			const folders = new Map<string, Date>();
			for await (const object of objectsUnder(base)) {
				const rest = object.Key?.slice(base.length) ?? '';
				const slash = rest.indexOf('/');
				if (slash <= 0) continue;
				const name = rest.slice(0, slash);
				const at = object.LastModified ?? new Date(0);
				const seen = folders.get(name);
				if (!seen || at > seen) folders.set(name, at);
			}
			return [...folders].map(([name, modifiedAt]) => ({ name, modifiedAt }));
		}
	};
}

// Uploads in transit in the bucket (STOPWISE_STORAGE=s3), shared by every node: @tus/s3-store keeps each upload as an S3
// multipart upload under its id at the bucket's top level (`<id>`, its description `<id>.info`, and `<id>.part`: bytes
// of a part too small for S3's 5 MiB minimum, such as a part cut off mid-way, added to the next one), so a frame's POST,
// its PATCHes and the attempt made from it may each reach another node. Finished uploads are read through a temporary
// file on this node's disk, never into memory.
import { DeleteObjectsCommand, GetObjectCommand, ListObjectsCommand, S3Client } from '@aws-sdk/client-s3';
import { S3Store, type MetadataValue } from '@tus/s3-store';
import type { KvStore } from '@tus/server';
import { randomBytes } from 'node:crypto';
import { createWriteStream } from 'node:fs';
import { mkdir, rm, stat } from 'node:fs/promises';
import { join } from 'node:path';
import type { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { UPLOAD_PART_BYTES } from '../../../attempts/upload-parts';
import { s3ClientConfig, type S3StoreOptions } from '../../storage/s3';
import { isUploadId, uploadDir } from './folder';
import { UPLOAD_TTL_MS, type UploadsInTransit } from './in-transit-store';

/**
 * No cache of upload descriptions: each request reads `<id>.info` from the bucket, so no node acts on what it remembers
 * of an upload another node has since finished or removed (and none keeps a copy of every upload it ever saw).
 */
const noCache: KvStore<MetadataValue> = {
	get: async () => undefined,
	set: async () => {},
	delete: async () => {}
};

const UPLOAD_KEY = /^([a-f0-9]{32})(\.info|\.part)?$/;

function checkedId(id: string): string {
	if (!isUploadId(id)) throw new RangeError(`invalid upload id: ${JSON.stringify(id)}`);
	return id;
}

function isMissing(error: unknown): boolean {
	const e = error as { name?: string; $metadata?: { httpStatusCode?: number }; status_code?: number };
	return e?.name === 'NoSuchKey' || e?.name === 'NotFound' || e?.name === 'NoSuchUpload' || e?.$metadata?.httpStatusCode === 404 || e?.status_code === 404;
}

/** @tus/s3-store that also removes a cut part's bytes (`<id>.part`) when an upload is removed, by tus (cancel) or by us. */
class S3UploadStore extends S3Store {
	override async remove(id: string): Promise<void> {
		try {
			await super.remove(id);
		} finally {
			await this.deleteIncompletePart(id);
		}
	}
}

export function createS3Uploads(options: S3StoreOptions): UploadsInTransit {
	const config = s3ClientConfig(options);
	const Bucket = options.bucket;
	const client = new S3Client(config);
	const datastore = new S3UploadStore({
		// one S3 part per part the browser sends (8 MiB), within S3's 5 MiB minimum
		partSize: UPLOAD_PART_BYTES,
		expirationPeriodInMilliseconds: UPLOAD_TTL_MS,
		// expiry is ours (the sweep), not the bucket's lifecycle rules: no object tags needed
		useTags: false,
		cache: noCache,
		s3ClientConfig: { ...config, bucket: Bucket }
	});

	/** Every key an upload may have left, whether or not its description is still there. */
	async function deleteKeys(id: string) {
		const Objects = ['', '.info', '.part'].map((suffix) => ({ Key: `${id}${suffix}` }));
		await client.send(new DeleteObjectsCommand({ Bucket, Delete: { Objects, Quiet: true } }));
	}

	return {
		datastore,
		async localCopy(id, size) {
			let answer;
			try {
				answer = await client.send(new GetObjectCommand({ Bucket, Key: checkedId(id) }));
			} catch (error) {
				if (isMissing(error)) return null;
				throw error;
			}
			// the object exists only once the multipart upload was completed, i.e. every byte arrived
			if (!answer.Body || (size !== undefined && answer.ContentLength !== size)) {
				(answer.Body as Readable | undefined)?.destroy();
				return null;
			}
			await mkdir(uploadDir(), { recursive: true });
			const path = join(uploadDir(), `copy-${id}-${randomBytes(6).toString('hex')}`);
			const release = () => rm(path, { force: true });
			try {
				await pipeline(answer.Body as Readable, createWriteStream(path, { flags: 'wx' }));
				const written = await stat(path);
				if (size !== undefined && written.size !== size) {
					await release();
					return null;
				}
			} catch (error) {
				await release();
				throw error;
			}
			return { path, release };
		},
		async remove(id) {
			checkedId(id);
			// aborts the multipart upload (its parts), removes the object, its description and a cut part's bytes
			try {
				await datastore.remove(id);
			} catch (error) {
				// no description (never written, or already removed): remove whatever else is left by its keys
				if (!isMissing(error)) throw error;
				await deleteKeys(id);
			}
		},
		async held() {
			const latest = new Map<string, Date>();
			let Marker: string | undefined;
			for (;;) {
				// only the top level: attempts/, clips/ and lesson-images/ come back as common prefixes and are skipped
				const page = await client.send(new ListObjectsCommand({ Bucket, Delimiter: '/', Marker }));
				for (const object of page.Contents ?? []) {
					const id = UPLOAD_KEY.exec(object.Key ?? '')?.[1];
					if (!id) continue;
					const at = object.LastModified ?? new Date(0);
					const seen = latest.get(id);
					if (!seen || at > seen) latest.set(id, at);
				}
				Marker = page.NextMarker ?? page.Contents?.at(-1)?.Key;
				if (!page.IsTruncated || !Marker) break;
			}
			return [...latest].map(([id, modifiedAt]) => ({ id, modifiedAt }));
		}
	};
}

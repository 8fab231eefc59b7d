// Frames and clips' videos on their way in (resumable uploads): one small interface over where their bytes wait, with
// two backends chosen with the file store (STOPWISE_STORAGE): this node's disk (`in-transit-disk.ts`) or the bucket
// (`in-transit-s3.ts`), which every node shares, so a part may reach any node. Callers never ask which one it is.
import { openAsBlob } from 'node:fs';
import { storageSettings } from '../../storage/settings';
import { createDiskUploads } from './in-transit-disk';
import { createS3Uploads } from './in-transit-s3';
import type { UploadsInTransit } from './in-transit-store';

export { UPLOAD_TTL_MS, type LocalCopy, type UploadsInTransit } from './in-transit-store';

let current: UploadsInTransit | undefined;

/** The backend every module uses, made from the environment on first use (a bad setting throws, naming it). */
export function uploadsInTransit(): UploadsInTransit {
	if (!current) {
		const settings = storageSettings(process.env);
		current = settings.kind === 's3' ? createS3Uploads(settings.s3) : createDiskUploads();
	}
	return current;
}

/** Swaps the backend (tests run the same upload flows against the bucket). Returns the previous one. */
export function useUploadsInTransit(uploads: UploadsInTransit): UploadsInTransit {
	const previous = uploadsInTransit();
	current = uploads;
	return previous;
}

/**
 * The uploaded bytes as a File whose contents stay on disk until read (`fs.openAsBlob`), so handing a frame to the
 * checks costs no memory up front; `release` when done with it. Null when the upload is gone or not the declared size.
 */
export async function uploadedFile(id: string, name: string, size: number): Promise<{ file: File; release: () => Promise<void> } | null> {
	const copy = await uploadsInTransit().localCopy(id, size);
	if (!copy) return null;
	try {
		return { file: new File([await openAsBlob(copy.path)], name), release: copy.release };
	} catch (error) {
		await copy.release();
		throw error;
	}
}

/** Removes an upload's bytes wherever they wait; missing ones are not an error. */
export function removeUploadFiles(id: string): Promise<void> {
	return uploadsInTransit().remove(id);
}

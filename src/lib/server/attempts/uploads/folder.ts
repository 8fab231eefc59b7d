// Where frames in transit live: the resumable uploads' folder (STOPWISE_UPLOAD_DIR), one file and one .json per upload.
import { openAsBlob } from 'node:fs';
import { rm, stat } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import { dataDir } from '../../storage/index';

/** Beside the file store's folder by default (`.data/files` → `.data/files-uploads`): never inside it, so no key reaches it. */
export function uploadDir(env: NodeJS.ProcessEnv = process.env): string {
	return resolve(env.STOPWISE_UPLOAD_DIR ?? `${dataDir}-uploads`);
}

// ids are made by us (hex), but a path is never built from anything else
const UPLOAD_ID = /^[a-f0-9]{32}$/;

export function isUploadId(id: string): boolean {
	return UPLOAD_ID.test(id);
}

function pathOf(id: string): string {
	if (!isUploadId(id)) throw new RangeError(`invalid upload id: ${JSON.stringify(id)}`);
	return join(uploadDir(), id);
}

/**
 * The uploaded bytes as a File whose contents stay on disk until read (`fs.openAsBlob`), so handing a frame to the
 * checks costs no memory up front. Null when the file is gone or is not the size the upload declared.
 */
export async function uploadedFile(id: string, name: string, size: number): Promise<File | null> {
	const path = pathOf(id);
	const found = await stat(path).catch(() => null);
	if (!found || found.size !== size) return null;
	const blob = await openAsBlob(path);
	return new File([blob], name);
}

/** Removes an upload's bytes and its tus description; missing files are not an error. */
export async function removeUploadFiles(id: string): Promise<void> {
	const path = pathOf(id);
	await Promise.all([rm(path, { force: true }), rm(`${path}.json`, { force: true })]);
}

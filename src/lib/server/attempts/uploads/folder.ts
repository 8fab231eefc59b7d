// This node's folder for uploads (STOPWISE_UPLOAD_DIR): resumable uploads when they stay on disk, the temporary files of
// one-request uploads, and local copies of uploads kept in the bucket while they are checked.
import { resolve } from 'node:path';
import { dataDir } from '../../storage/index';

/** Beside the file store's folder by default (`.data/files` → `.data/files-uploads`): never inside it, so no key reaches it. */
export function uploadDir(env: NodeJS.ProcessEnv = process.env): string {
	return resolve(env.STOPWISE_UPLOAD_DIR ?? `${dataDir}-uploads`);
}

// ids are made by us (hex), but a path or key is never built from anything else
const UPLOAD_ID = /^[a-f0-9]{32}$/;

export function isUploadId(id: string): boolean {
	return UPLOAD_ID.test(id);
}

/** Temporary entries of this folder (one-request uploads, copies from the bucket): swept when old. */
export const TEMPORARY_PREFIXES = ['multipart-', 'copy-'] as const;

// Uploads in transit on this node's disk (STOPWISE_UPLOAD_DIR): @tus/file-store, one file and one `.json` per upload.
// Right for one node; with several, a learner's parts may reach a node that lacks the file (use the bucket then).
import { FileStore } from '@tus/file-store';
import { readdir, rm, stat } from 'node:fs/promises';
import { join } from 'node:path';
import { isUploadId, uploadDir } from './folder';
import { UPLOAD_TTL_MS, type UploadsInTransit } from './in-transit-store';

function pathOf(id: string): string {
	if (!isUploadId(id)) throw new RangeError(`invalid upload id: ${JSON.stringify(id)}`);
	return join(uploadDir(), id);
}

export function createDiskUploads(): UploadsInTransit {
	return {
		datastore: new FileStore({ directory: uploadDir(), expirationPeriodInMilliseconds: UPLOAD_TTL_MS }),
		async localCopy(id, size) {
			const path = pathOf(id);
			const found = await stat(path).catch(() => null);
			if (!found?.isFile() || (size !== undefined && found.size !== size)) return null;
			// the file is the upload itself: it goes with `remove`, not when the reader is done
			return { path, release: async () => {} };
		},
		async remove(id) {
			const path = pathOf(id);
			await Promise.all([rm(path, { force: true }), rm(`${path}.json`, { force: true })]);
		},
		async held() {
			const dir = uploadDir();
			const names = await readdir(dir).catch(() => [] as string[]);
			const ids = [...new Set(names.map((n) => n.replace(/\.json$/, '')).filter(isUploadId))];
			const found: { id: string; modifiedAt: Date }[] = [];
			for (const id of ids) {
				const info = (await stat(join(dir, `${id}.json`)).catch(() => null)) ?? (await stat(join(dir, id)).catch(() => null));
				if (info) found.push({ id, modifiedAt: info.mtime });
			}
			return found;
		}
	};
}

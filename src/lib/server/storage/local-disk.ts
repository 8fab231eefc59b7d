// FileStore on the local disk under one root folder (STOPWISE_DATA_DIR); writes go to a temp name, then rename.
import { randomBytes } from 'node:crypto';
import { mkdir, open, readdir, readFile, rename, rm, stat, writeFile } from 'node:fs/promises';
import { dirname, join, resolve } from 'node:path';
import { Readable } from 'node:stream';
import { checkKey, checkRange, type FileStore, type StoredStream } from './store';

/**
 * A file's bytes as a stream with their length; with a range, bytes `start` to `end` (a range past the end reads what
 * there is, as S3 does). The size and the stream come from one open file, so a put renamed over it meanwhile cannot mix them.
 */
async function openFile(path: string, range?: { start: number; end: number }): Promise<StoredStream | null> {
	const handle = await open(path, 'r').catch((error: NodeJS.ErrnoException) => {
		if (error.code === 'ENOENT' || error.code === 'EISDIR') return null;
		throw error;
	});
	if (!handle) return null;
	try {
		const info = await handle.stat();
		if (!info.isFile()) {
			await handle.close();
			return null;
		}
		const start = range?.start ?? 0;
		const last = Math.min(range?.end ?? info.size - 1, info.size - 1);
		// an empty file or a range wholly past the end reads nothing, and the stream still ends and closes the file
		const stream = handle.createReadStream({ start, end: Math.max(start, last), autoClose: true });
		return { body: Readable.toWeb(stream) as ReadableStream<Uint8Array>, size: Math.max(0, last - start + 1) };
	} catch (error) {
		await handle.close();
		throw error;
	}
}

export function createLocalDiskStore(root: string): FileStore {
	const base = resolve(root);
	const pathOf = (key: string) => join(base, ...checkKey(key));

	return {
		async put(key, data) {
			const target = pathOf(key);
			await mkdir(dirname(target), { recursive: true });
			// rename is atomic within one file system: a crash mid-write leaves only a stray temp file
			const temp = `${target}.tmp-${randomBytes(6).toString('hex')}`;
			try {
				await writeFile(temp, data);
				await rename(temp, target);
			} catch (error) {
				await rm(temp, { force: true });
				throw error;
			}
		},
		async get(key) {
			try {
				return await readFile(pathOf(key));
			} catch (error) {
				if ((error as NodeJS.ErrnoException).code === 'ENOENT') return null;
				throw error;
			}
		},
		async open(key) {
			return openFile(pathOf(key));
		},
		async openRange(key, start, end) {
			checkRange(start, end);
			return openFile(pathOf(key), { start, end });
		},
		async delete(key) {
			await rm(pathOf(key), { force: true });
		},
		async deletePrefix(prefix) {
			await rm(pathOf(prefix), { recursive: true, force: true });
		},
		async listFolders(prefix) {
			const folder = pathOf(prefix);
			const entries = await readdir(folder, { withFileTypes: true }).catch((error: NodeJS.ErrnoException) => {
				if (error.code === 'ENOENT') return [];
				throw error;
			});
			const folders = entries.filter((e) => e.isDirectory());
			// a folder's own time changes whenever a file is added to it or renamed into it
			return Promise.all(folders.map(async (e) => ({ name: e.name, modifiedAt: (await stat(join(folder, e.name))).mtime })));
		}
	};
}

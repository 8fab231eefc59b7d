// The app's file store: local disk under STOPWISE_DATA_DIR (default .data/files), behind the FileStore interface.
import { join } from 'node:path';
import { createLocalDiskStore } from './local-disk';
import type { FileStore } from './store';

export { checkKey, type FileStore } from './store';
export { createLocalDiskStore } from './local-disk';

export const dataDir = process.env.STOPWISE_DATA_DIR ?? join(process.cwd(), '.data', 'files');

let current: FileStore | undefined;

/** The store every module uses; an object store only has to implement FileStore and be set here. */
export function fileStore(): FileStore {
	current ??= createLocalDiskStore(dataDir);
	return current;
}

/** Swaps the store (tests use it to make writes fail on purpose). Returns the previous one. */
export function useFileStore(store: FileStore): FileStore {
	const previous = fileStore();
	current = store;
	return previous;
}

// The app's file store, chosen by STOPWISE_STORAGE: local disk under STOPWISE_DATA_DIR (default .data/files) or an S3 bucket.
import { join } from 'node:path';
import { createLocalDiskStore } from './local-disk';
import { createS3Store } from './s3';
import { storageSettings } from './settings';
import type { FileStore } from './store';

export { checkKey, type FileStore, type StoredStream } from './store';
export { createLocalDiskStore } from './local-disk';
export { createS3Store } from './s3';
export { storageSettings, type StorageSettings } from './settings';

export const dataDir = process.env.STOPWISE_DATA_DIR ?? join(process.cwd(), '.data', 'files');

let current: FileStore | undefined;

/** The store every module uses, made from the environment on first use (a bad setting throws, naming it). */
export function fileStore(): FileStore {
	if (!current) {
		const settings = storageSettings(process.env);
		current = settings.kind === 's3' ? createS3Store(settings.s3) : createLocalDiskStore(dataDir);
	}
	return current;
}

/** Swaps the store (tests use it to make writes fail on purpose). Returns the previous one. */
export function useFileStore(store: FileStore): FileStore {
	const previous = fileStore();
	current = store;
	return previous;
}

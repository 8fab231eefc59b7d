// The file store interface: what attempts and lesson images need from any backend (local disk or an S3-compatible bucket).

/** Keys are slash-separated paths of safe segments, e.g. `attempts/<id>/0-original.jpg`. */
export interface FileStore {
	/** Writes the whole value; a reader never sees half a file under `key`. */
	put(key: string, data: Uint8Array): Promise<void>;
	/** The bytes, or null when nothing is stored under `key`. */
	get(key: string): Promise<Buffer | null>;
	/** The bytes as a stream with their length, for serving without holding the file in memory; null when missing. */
	open(key: string): Promise<StoredStream | null>;
	/**
	 * Bytes `start` to `end` (both included, as in an HTTP Range) as a stream, for range requests: `size` is the length of
	 * that part. The caller knows the value's length and asks only within it; null when nothing is stored under `key`.
	 */
	openRange(key: string, start: number, end: number): Promise<StoredStream | null>;
	/** Removes one key; removing a missing key is not an error. */
	delete(key: string): Promise<void>;
	/** Removes every key under `prefix/` (an attempt's folder); a missing prefix is not an error. */
	deletePrefix(prefix: string): Promise<void>;
	/**
	 * The folders directly under `prefix/` (e.g. each attempt's under `attempts`) with when something in each was last
	 * written, for the sweep of files left by a crash; a missing prefix lists nothing.
	 */
	listFolders(prefix: string): Promise<{ name: string; modifiedAt: Date }[]>;
}

/** A stored value being read: read `body` once, to the end or cancelled. */
export interface StoredStream {
	body: ReadableStream<Uint8Array>;
	size: number;
}

/** Throws unless `start`–`end` is a range of at least one byte (both included). */
export function checkRange(start: number, end: number): void {
	if (!Number.isSafeInteger(start) || !Number.isSafeInteger(end) || start < 0 || end < start) throw new RangeError(`invalid byte range: ${start}-${end}`);
}

const SEGMENT = /^[A-Za-z0-9][A-Za-z0-9._-]{0,127}$/;

/** Throws on a key that could leave the store (`..`, absolute paths, odd characters). */
export function checkKey(key: string): string[] {
	const parts = key.split('/');
	if (parts.length === 0 || parts.length > 8 || !parts.every((p) => SEGMENT.test(p) && !p.includes('..'))) {
		throw new RangeError(`invalid storage key: ${JSON.stringify(key)}`);
	}
	return parts;
}

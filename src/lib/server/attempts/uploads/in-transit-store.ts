// What every backend of the uploads in transit offers (the disk of one node, or the bucket all nodes share).
import type { DataStore } from '@tus/server';

/** An upload not finished and made into an attempt within this time is swept (and answers 410 Gone before that). */
export const UPLOAD_TTL_MS = 24 * 60 * 60 * 1000;

/** A finished upload's bytes as a file on this node's disk, for as long as the caller needs it. */
export interface LocalCopy {
	path: string;
	/** Removes the copy when it was made for the caller (the disk backend's own file stays until `remove`). */
	release(): Promise<void>;
}

export interface UploadsInTransit {
	/** The tus datastore the parts are written to. */
	readonly datastore: DataStore;
	/** The finished upload as a file here, never read into memory; null when it is gone or (given `size`) not that size. */
	localCopy(id: string, size?: number): Promise<LocalCopy | null>;
	/** Removes every byte the upload left (finished or not); a missing upload is not an error. */
	remove(id: string): Promise<void>;
	/** Each upload that has bytes held, and when it was last written: the sweep removes those no row owns. */
	held(): Promise<{ id: string; modifiedAt: Date }[]>;
}

// Opaque cursors for the review queue: the group, creation time (to the microsecond) and id of the last row shown.
import type { QueueSort } from '../../attempts/queue-params';

export interface QueueCursor {
	sort: QueueSort;
	/** 0 = needs review (in the default sort), 1 = the rest */
	group: 0 | 1;
	/** PostgreSQL timestamp text in UTC, microseconds kept so equal milliseconds do not skip rows */
	createdAt: string;
	id: string;
}

const TIME = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{6}Z$/;
const ID = /^[A-Za-z0-9-]{1,64}$/;

export function encodeCursor(c: QueueCursor): string {
	return Buffer.from(JSON.stringify([c.sort, c.group, c.createdAt, c.id])).toString('base64url');
}

/** null when the text is not a cursor this code made (tampered, truncated or from another sort). */
export function decodeCursor(text: string, sort: QueueSort): QueueCursor | null {
	try {
		const value: unknown = JSON.parse(Buffer.from(text, 'base64url').toString('utf8'));
		if (!Array.isArray(value) || value.length !== 4) return null;
		const [s, group, createdAt, id] = value;
		if (s !== sort || (group !== 0 && group !== 1) || typeof createdAt !== 'string' || !TIME.test(createdAt) || typeof id !== 'string' || !ID.test(id)) return null;
		return { sort, group, createdAt, id };
	} catch {
		return null;
	}
}

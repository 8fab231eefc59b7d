// Review queue cursors round-trip exactly and refuse anything they did not make.
import { describe, expect, it } from 'vitest';
import { decodeCursor, encodeCursor } from './cursor';

const cursor = { sort: 'queue', group: 1, createdAt: '2026-05-03T10:00:00.123456Z', id: '0b1e2f3a-0000-4000-8000-000000000001' } as const;

describe('queue cursor', () => {
	it('round-trips, microseconds included', () => {
		expect(decodeCursor(encodeCursor(cursor), 'queue')).toEqual(cursor);
	});
	it('is refused for another sort, when tampered or when it is not a cursor at all', () => {
		expect(decodeCursor(encodeCursor(cursor), 'newest')).toBeNull();
		const tampered = Buffer.from(JSON.stringify(['queue', 1, '2026-05-03T10:00:00Z; drop table', cursor.id])).toString('base64url');
		expect(decodeCursor(tampered, 'queue')).toBeNull();
		expect(decodeCursor(Buffer.from(JSON.stringify(['queue', 7, cursor.createdAt, cursor.id])).toString('base64url'), 'queue')).toBeNull();
		expect(decodeCursor('%%%', 'queue')).toBeNull();
		expect(decodeCursor('', 'queue')).toBeNull();
	});
});

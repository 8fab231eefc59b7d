// Review queue parameters: defaults, fallbacks for junk, and a round trip through the query string.
import { describe, expect, it } from 'vitest';
import { DEFAULT_LIMIT, MAX_LIMIT, queueSearch, readQueueParams } from './queue-params';

describe('review queue params', () => {
	it('defaults to the open queue, needs-review first', () => {
		expect(readQueueParams(new URLSearchParams())).toEqual({ status: 'open', sort: 'queue', course: '', assignment: '', age: '', cohort: '', limit: DEFAULT_LIMIT, cursor: '' });
	});

	it('falls back on unknown values and caps the page size', () => {
		const p = readQueueParams(new URLSearchParams('status=drop&sort=1;--&course=../x&assignment=Off%20the&age=ancient&limit=5000'));
		expect(p).toMatchObject({ status: 'open', sort: 'queue', course: '', assignment: '', age: '', limit: MAX_LIMIT });
		expect(readQueueParams(new URLSearchParams('limit=-2')).limit).toBe(DEFAULT_LIMIT);
	});

	it('round-trips through the query string, leaving defaults out', () => {
		const p = { status: 'reviewed', sort: 'newest', course: 'daylight-flash-for-action', assignment: 'dim-the-sky', age: 'week', cohort: 'spring-evenings-2027', limit: 10, cursor: 'abc' } as const;
		const search = queueSearch(p);
		expect(readQueueParams(new URLSearchParams(search.slice(1)))).toEqual(p);
		expect(queueSearch({ status: 'open', sort: 'queue', limit: DEFAULT_LIMIT })).toBe('');
	});
});

// STOPWISE_VISITOR_CACHE_MB: the visitor page cache's bound.
import { expect, test } from 'vitest';
import { DEFAULT_VISITOR_CACHE_MB, visitorCacheBytes } from './settings';

test('megabytes to bytes; unset means the default; 0 turns the cache off', () => {
	expect(visitorCacheBytes({})).toBe(DEFAULT_VISITOR_CACHE_MB * 1024 * 1024);
	expect(visitorCacheBytes({ STOPWISE_VISITOR_CACHE_MB: ' 8 ' })).toBe(8 * 1024 * 1024);
	expect(visitorCacheBytes({ STOPWISE_VISITOR_CACHE_MB: '0.5' })).toBe(512 * 1024);
	expect(visitorCacheBytes({ STOPWISE_VISITOR_CACHE_MB: '0' })).toBe(0);
});

test('anything else stops the app with a message naming the variable', () => {
	for (const wrong of ['-1', 'lots', '1e3', '32MB']) {
		expect(() => visitorCacheBytes({ STOPWISE_VISITOR_CACHE_MB: wrong })).toThrow(/STOPWISE_VISITOR_CACHE_MB/);
	}
});

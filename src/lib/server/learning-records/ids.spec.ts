import { describe, expect, test } from 'vitest';
import { statementIdFor, uuidV5 } from './ids';

describe('uuidV5', () => {
	test('matches the published name-based UUID example', () => {
		// RFC 4122 §4.3, DNS namespace (Appendix C); the value is the example in Python's uuid module documentation
		expect(uuidV5('python.org', '6ba7b810-9dad-11d1-80b4-00c04fd430c8')).toBe('886313e1-3b8a-5372-9b90-0c9aee199e5d');
	});

	test('the same event gives the same statement id, another event another id; every id is a version-5 UUID', () => {
		const a = statementIdFor('lesson-completed', 'user-1', 7);
		expect(statementIdFor('lesson-completed', 'user-1', 7)).toBe(a);
		expect(statementIdFor('lesson-completed', 'user-1', 8)).not.toBe(a);
		expect(a).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-5[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
	});
});

// What an upload must say about itself before any byte is accepted.
import { describe, expect, it } from 'vitest';
import { readUploadMetadata } from './metadata';

describe('readUploadMetadata', () => {
	it('reads the assignment, frame and submission key', () => {
		expect(readUploadMetadata({ assignment: 'off-the-axis', frame: 'lit', submissionKey: 'abcdef12-3456', filename: 'x.jpg' })).toEqual({
			ok: true,
			assignment: 'off-the-axis',
			frame: 'lit',
			submissionKey: 'abcdef12-3456'
		});
	});

	it('refuses a missing or malformed field with the learner-facing reason', () => {
		expect(readUploadMetadata(undefined)).toMatchObject({ ok: false, message: expect.stringMatching(/which assignment/) });
		expect(readUploadMetadata({ assignment: '../etc', frame: 'lit', submissionKey: 'abcdef1234' })).toMatchObject({ ok: false });
		expect(readUploadMetadata({ assignment: 'a', frame: '', submissionKey: 'abcdef1234' })).toMatchObject({ ok: false, message: expect.stringMatching(/which frame/) });
		expect(readUploadMetadata({ assignment: 'a', frame: 'x'.repeat(61), submissionKey: 'abcdef1234' })).toMatchObject({ ok: false });
		expect(readUploadMetadata({ assignment: 'a', frame: 'lit', submissionKey: 'short' })).toMatchObject({ ok: false, message: expect.stringMatching(/submission key/) });
		expect(readUploadMetadata({ assignment: 'a', frame: 'lit', submissionKey: 'has spaces in it' })).toMatchObject({ ok: false });
	});
});

import { describe, expect, it } from 'vitest';
import { signInReason } from './sign-in-reason';

describe('signInReason', () => {
	it('says what the visitor was about to open', () => {
		expect(signInReason('/courses/daylight-flash-for-action/what-a-stop-is')).toBe('Sign in to open this lesson.');
		expect(signInReason('/courses/daylight-flash-for-action/dim-the-sky/assignments/two-under?x=1')).toBe('Sign in to open this Assignment.');
		expect(signInReason('/courses/daylight-flash-for-action')).toBe('Sign in to enrol in this course.');
		expect(signInReason('/attempts/abc')).toBe('Sign in to see this Attempt and its Verdict.');
		expect(signInReason('/mentor?status=open')).toBe('Sign in to open the Review queue.');
		expect(signInReason('/account/billing')).toBe('Sign in to see your billing and receipts.');
		expect(signInReason('/account')).toBe('Sign in to manage your account.');
	});

	it('says nothing when there is nothing particular to say', () => {
		expect(signInReason(null)).toBeNull();
		expect(signInReason('')).toBeNull();
		expect(signInReason('/courses')).toBeNull();
		expect(signInReason('/')).toBeNull();
	});
});

// Assignment lookup tolerates odd page data; verdict badges and dates read the same on server and browser.
import { describe, expect, it } from 'vitest';
import { findAssignment, showVerdictDate, verdictBadge } from './assignment';

describe('findAssignment', () => {
	it('finds by slug and keeps only usable fields', () => {
		const found = findAssignment(
			[
				{ slug: 'other', title: 'Other' },
				{ slug: 'dim-the-sky', title: 'Dim the sky', brief: 'Two frames.', frames: ['reference', 7, 'under'], criteria: ['Under by 1.5 stops'], lastVerdict: { verdict: 'pass', at: new Date('2026-05-03T10:00:00Z') }, uploadHref: '' }
			],
			'dim-the-sky'
		);
		expect(found).toEqual({
			ok: true,
			value: {
				slug: 'dim-the-sky',
				title: 'Dim the sky',
				brief: 'Two frames.',
				frames: ['reference', 'under'],
				criteria: ['Under by 1.5 stops'],
				lastVerdict: { verdict: 'pass', at: '2026-05-03T10:00:00.000Z' },
				uploadHref: null
			}
		});
	});
	it('says why when there is nothing to show', () => {
		expect(findAssignment(undefined, 'dim-the-sky')).toEqual({ ok: false, message: 'No assignment “dim-the-sky” is defined for this lesson.' });
		expect(findAssignment('not a list', 'x').ok).toBe(false);
		expect(findAssignment([{ slug: 'x' }], ' ').ok).toBe(false);
	});
	it('drops a verdict without a verdict word', () => {
		const found = findAssignment([{ slug: 'x', lastVerdict: { at: '2026-01-01' } }], 'x');
		expect(found.ok && found.value.lastVerdict).toBeNull();
	});
});

describe('verdict display', () => {
	it('maps known verdicts to words and tones', () => {
		expect(verdictBadge('pass')).toEqual({ label: 'Passed', tone: 'pass' });
		expect(verdictBadge('FAIL')).toEqual({ label: 'Not yet', tone: 'fail' });
		expect(verdictBadge('review')).toEqual({ label: 'With a mentor', tone: 'review' });
		// the attempts block stores this verdict as 'needs-review'
		expect(verdictBadge('needs-review')).toEqual({ label: 'With a mentor', tone: 'review' });
		expect(verdictBadge('excellent')).toEqual({ label: 'excellent', tone: 'neutral' });
	});
	it('shows dates in UTC and passes unreadable ones through', () => {
		expect(showVerdictDate('2026-05-03T23:30:00Z')).toBe('3 May 2026');
		expect(showVerdictDate('last Tuesday')).toBe('last Tuesday');
	});
});

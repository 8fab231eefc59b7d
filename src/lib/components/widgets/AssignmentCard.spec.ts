// Assignment card shows the brief, frames, criteria, last verdict and upload entry point from page data, or a notice.
import { render } from 'svelte/server';
import { beforeEach, describe, expect, it, vi } from 'vitest';
import AssignmentCard from './AssignmentCard.svelte';
import { attrOf, elementsByTestId, listItems, textOf } from './parts/ssr-html';

const fake = vi.hoisted(() => ({ data: {} as Record<string, unknown> }));
vi.mock('$app/state', () => ({
	page: {
		get data() {
			return fake.data;
		}
	}
}));

// Invented demo data (Harbor Lane Athletics, "Daylight Flash for Action").
const dimTheSky = {
	slug: 'dim-the-sky',
	title: 'Dim the sky',
	brief: 'Make a reference frame at the meter, then one a stop and a half under it.',
	frames: ['reference', 'under'],
	criteria: ['The second frame is about 1½ stops under the first.', 'The sky is visibly darker.'],
	lastVerdict: { verdict: 'fail', at: '2026-04-12T08:00:00Z' },
	uploadHref: '/courses/daylight-flash-for-action/assignments/dim-the-sky/attempts/new'
};
const show = (slug: string) => render(AssignmentCard, { props: { slug } }).body;

describe('Assignment card', () => {
	beforeEach(() => {
		fake.data = { assignments: [{ slug: 'three-rungs', title: 'Three rungs' }, dimTheSky] };
	});

	it('shows the brief, frames, criteria, last verdict and upload link', () => {
		const body = show('dim-the-sky');
		expect(textOf(body, 'assignment-title')).toBe('Dim the sky');
		expect(textOf(body, 'assignment-brief')).toBe(dimTheSky.brief);
		expect(listItems(body, 'assignment-frames')).toEqual(['reference', 'under']);
		expect(listItems(body, 'assignment-criteria')).toEqual(dimTheSky.criteria);
		expect(textOf(body, 'assignment-verdict')).toBe('Last verdict: Not yet · 12 Apr 2026');
		expect(body).toContain(`href="${dimTheSky.uploadHref}"`);
		expect(textOf(body, 'assignment-upload')).toBe('Upload your frames');
	});

	it('without an upload link, says when uploads open; without a verdict, shows no badge', () => {
		fake.data = { assignments: [{ ...dimTheSky, uploadHref: null, lastVerdict: null }] };
		const body = show('dim-the-sky');
		expect(textOf(body, 'assignment-upload')).toBe('Uploads open once you are enrolled and signed in.');
		expect(elementsByTestId(body, 'assignment-verdict')).toHaveLength(0);
	});

	it('shows a notice for an unknown slug or missing page data, without throwing', () => {
		expect(textOf(show('no-such'), 'widget-notice')).toContain('No assignment “no-such”');
		fake.data = {};
		expect(textOf(show('dim-the-sky'), 'widget-notice')).toContain('No assignment “dim-the-sky”');
		expect(attrOf(show('dim-the-sky'), 'widget-notice', 'role')).toBe('note');
	});
});

// Finds an Assignment in the page data by slug and shapes it for the card, tolerating missing or odd fields.

import type { AssignmentCard } from '$lib/lessons/page-data';

/** What the Assignment card shows: the shape the lesson page sends. */
export type AssignmentView = AssignmentCard;

const strings = (v: unknown): string[] => (Array.isArray(v) ? v.filter((x): x is string => typeof x === 'string' && x.trim() !== '') : []);

function readVerdict(v: unknown): AssignmentView['lastVerdict'] {
	if (!v || typeof v !== 'object') return null;
	const { verdict, at } = v as { verdict?: unknown; at?: unknown };
	if (typeof verdict !== 'string' || !verdict.trim()) return null;
	const when = at instanceof Date ? at.toISOString() : typeof at === 'string' ? at : null;
	return { verdict: verdict.trim(), at: when };
}

/** The assignment with this slug from `page.data.assignments`, or a plain reason it cannot be shown. */
export function findAssignment(assignments: unknown, slug: string): { ok: true; value: AssignmentView } | { ok: false; message: string } {
	if (!slug.trim()) return { ok: false, message: 'This Assignment card has no slug, so it cannot show an assignment.' };
	const list = Array.isArray(assignments) ? assignments : [];
	const raw = list.find((a) => a && typeof a === 'object' && (a as { slug?: unknown }).slug === slug) as Record<string, unknown> | undefined;
	if (!raw) return { ok: false, message: `No assignment “${slug}” is defined for this lesson.` };
	const href = typeof raw.uploadHref === 'string' && raw.uploadHref.trim() ? raw.uploadHref : null;
	return {
		ok: true,
		value: {
			slug,
			title: typeof raw.title === 'string' && raw.title.trim() ? raw.title : slug,
			brief: typeof raw.brief === 'string' ? raw.brief : '',
			frames: strings(raw.frames),
			criteria: strings(raw.criteria),
			lastVerdict: readVerdict(raw.lastVerdict),
			uploadHref: href
		}
	};
}

/** Words and colour for a verdict badge; a verdict we do not know is shown as written, in the neutral tone. */
export function verdictBadge(verdict: string): { label: string; tone: 'pass' | 'fail' | 'review' | 'neutral' } {
	switch (verdict.toLowerCase()) {
		case 'pass':
		case 'passed':
			return { label: 'Passed', tone: 'pass' };
		case 'fail':
		case 'failed':
			return { label: 'Not yet', tone: 'fail' };
		case 'review':
		case 'needs-review':
		case 'unknown':
		case 'pending':
			return { label: 'With a mentor', tone: 'review' };
		default:
			return { label: verdict, tone: 'neutral' };
	}
}

// made once: making a date format costs far more than using one
const verdictDay = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric', timeZone: 'UTC' });

/** A verdict's date as '3 May 2026' (UTC, so server and browser agree); unreadable dates are shown as given. */
export function showVerdictDate(at: string): string {
	const date = new Date(at);
	if (Number.isNaN(date.getTime())) return at;
	return verdictDay.format(date);
}

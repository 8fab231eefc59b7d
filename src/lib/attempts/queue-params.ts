// The review queue's URL parameters (filters, sort, cursor), read the same way by the API route and the mentor's table.

export const QUEUE_STATUSES = ['open', 'needs-review', 'reviewed', 'all'] as const;
export type QueueStatus = (typeof QUEUE_STATUSES)[number];
export const QUEUE_SORTS = ['queue', 'oldest', 'newest'] as const;
export type QueueSort = (typeof QUEUE_SORTS)[number];
export const QUEUE_AGES = ['', 'today', 'week', 'older'] as const;
export type QueueAge = (typeof QUEUE_AGES)[number];

export const STATUS_LABELS: Record<QueueStatus, string> = {
	open: 'Waiting for a critique',
	'needs-review': 'Needs review only',
	reviewed: 'Reviewed',
	all: 'All'
};
export const SORT_LABELS: Record<QueueSort, string> = { queue: 'Needs review first, then oldest', oldest: 'Oldest first', newest: 'Newest first' };
export const AGE_LABELS: Record<QueueAge, string> = { '': 'Any age', today: 'Last 24 hours', week: '1 to 7 days old', older: 'Over 7 days old' };

export const DEFAULT_LIMIT = 25;
export const MAX_LIMIT = 100;

export interface QueueParams {
	status: QueueStatus;
	sort: QueueSort;
	/** course slug, or '' for every course */
	course: string;
	/** assignment slug, or '' for every assignment */
	assignment: string;
	age: QueueAge;
	/** cohort slug, or '' for every learner */
	cohort: string;
	limit: number;
	/** opaque, from the previous page's nextCursor */
	cursor: string;
}

const SLUG = /^[a-z0-9][a-z0-9-]{0,99}$/;

function oneOf<T extends string>(value: string | null, allowed: readonly T[], fallback: T): T {
	return value !== null && (allowed as readonly string[]).includes(value) ? (value as T) : fallback;
}

/** Unknown values fall back to defaults rather than failing: a stale bookmark still opens the queue. */
export function readQueueParams(search: URLSearchParams): QueueParams {
	const limit = Number(search.get('limit'));
	const slug = (key: string) => {
		const v = search.get(key)?.trim() ?? '';
		return SLUG.test(v) ? v : '';
	};
	return {
		status: oneOf(search.get('status'), QUEUE_STATUSES, 'open'),
		sort: oneOf(search.get('sort'), QUEUE_SORTS, 'queue'),
		course: slug('course'),
		assignment: slug('assignment'),
		age: oneOf(search.get('age'), QUEUE_AGES, ''),
		cohort: slug('cohort'),
		limit: Number.isInteger(limit) && limit >= 1 ? Math.min(limit, MAX_LIMIT) : DEFAULT_LIMIT,
		cursor: (search.get('cursor') ?? '').slice(0, 400)
	};
}

/** The query string for these params, leaving out defaults. */
export function queueSearch(params: Partial<QueueParams>): string {
	const out = new URLSearchParams();
	if (params.status && params.status !== 'open') out.set('status', params.status);
	if (params.sort && params.sort !== 'queue') out.set('sort', params.sort);
	if (params.course) out.set('course', params.course);
	if (params.assignment) out.set('assignment', params.assignment);
	if (params.age) out.set('age', params.age);
	if (params.cohort) out.set('cohort', params.cohort);
	if (params.limit && params.limit !== DEFAULT_LIMIT) out.set('limit', String(params.limit));
	if (params.cursor) out.set('cursor', params.cursor);
	const text = out.toString();
	return text ? `?${text}` : '';
}

// Which requests the visitor page cache may answer and which answers it may keep. An allow-list of routes: a page is
// cached only when it is named here, reads nothing but tables the content epoch watches, and is the same for every visitor.
/**
 * Public pages that a visitor (no cookie) sees alike, and whose database reads are all of tables the epoch's triggers
 * watch (courses, modules, lessons, assignments, lesson_clips). A page added here must read nothing else.
 */
export const CACHED_ROUTES: ReadonlySet<string> = new Set([
	// the landing page (no database reads)
	'/(public)',
	// the catalogue: courses
	'/(public)/courses',
	// a course page: courses, modules, lessons, assignments
	'/(public)/courses/[course]',
	// a lesson page: lessons, modules, courses, assignments, lesson_clips; a paid lesson answers a visitor with a redirect, never kept
	'/(learn)/courses/[course]/[lesson]',
	// an instructor's profile: courses
	'/(public)/instructors/[slug]'
]);

/**
 * A GET of a whole page on the allow-list from someone without any cookie or credentials. Not the client router's data
 * requests (`__data.json`): Kit marks those `private, no-store`, so they would never be kept anyway.
 */
export function isVisitorPageRequest(event: { request: Request; route: { id: string | null }; isDataRequest: boolean }): boolean {
	const { request } = event;
	if (request.method !== 'GET' || event.isDataRequest) return false;
	if (request.headers.has('cookie') || request.headers.has('authorization')) return false;
	return event.route.id !== null && CACHED_ROUTES.has(event.route.id);
}

/**
 * An answer every visitor would get alike: a 200 that sets no cookie, does not vary by request header, does not ask
 * not to be stored, and carries no CSP nonce (a nonce belongs to one response; kit.csp's hash mode has none).
 */
export function isKeepable(response: Response): boolean {
	if (response.status !== 200) return false;
	const headers = response.headers;
	if (headers.has('set-cookie') || headers.has('vary')) return false;
	if (/no-store|private/i.test(headers.get('cache-control') ?? '')) return false;
	if (/'nonce-/.test(headers.get('content-security-policy') ?? '')) return false;
	return true;
}

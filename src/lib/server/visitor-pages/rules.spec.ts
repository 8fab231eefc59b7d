// Which requests the visitor page cache answers and which answers it keeps.
import { describe, expect, test } from 'vitest';
import { isKeepable, isVisitorPageRequest } from './rules';

const request = (init: { method?: string; headers?: Record<string, string> } = {}) => new Request('http://localhost/courses/x', init);

describe('a visitor page request', () => {
	test('is a GET without cookie or credentials, for a route on the allow-list', () => {
		expect(isVisitorPageRequest({ request: request(), isDataRequest: false, route: { id: '/(public)/courses/[course]' } })).toBe(true);
		expect(isVisitorPageRequest({ request: request(), isDataRequest: false, route: { id: '/(public)' } })).toBe(true);
		expect(isVisitorPageRequest({ request: request({ headers: { cookie: 'a=b' } }), isDataRequest: false, route: { id: '/(public)/courses/[course]' } })).toBe(false);
		expect(isVisitorPageRequest({ request: request({ headers: { authorization: 'Basic eDp5' } }), isDataRequest: false, route: { id: '/(public)' } })).toBe(false);
		expect(isVisitorPageRequest({ request: request({ method: 'POST' }), isDataRequest: false, route: { id: '/(public)/courses/[course]' } })).toBe(false);
		expect(isVisitorPageRequest({ request: request({ method: 'HEAD' }), isDataRequest: false, route: { id: '/(public)' } })).toBe(false);
		// the client router's data requests are Kit's private, no-store answers
		expect(isVisitorPageRequest({ request: request(), isDataRequest: true, route: { id: '/(public)/courses/[course]' } })).toBe(false);
	});

	test('never for a route the list does not name: learners, staff, the API, unknown addresses', () => {
		for (const id of ['/(learn)/progress', '/(author)/author', '/(admin)/admin', '/(mentor)/mentor', '/api/v1/me', '/(learn)/attempts/[id]', '/(public)/signin']) {
			expect(isVisitorPageRequest({ request: request(), isDataRequest: false, route: { id } }), id).toBe(false);
		}
		expect(isVisitorPageRequest({ request: request(), isDataRequest: false, route: { id: null } })).toBe(false);
	});
});

describe('an answer worth keeping', () => {
	const ok = (headers: Record<string, string> = {}, status = 200) => new Response('<p>page</p>', { status, headers: { 'content-type': 'text/html', ...headers } });

	test('is a 200 that is the same for every visitor', () => {
		expect(isKeepable(ok({ 'content-security-policy': "script-src 'self' 'sha256-abc='", etag: '"1"' }))).toBe(true);
	});

	test('not one that sets a cookie, varies by request, asks not to be stored, carries a nonce, or is not a 200', () => {
		expect(isKeepable(ok({ 'set-cookie': 'a=b' }))).toBe(false);
		expect(isKeepable(ok({ vary: 'accept-language' }))).toBe(false);
		expect(isKeepable(ok({ 'cache-control': 'private, max-age=0' }))).toBe(false);
		expect(isKeepable(ok({ 'cache-control': 'no-store' }))).toBe(false);
		expect(isKeepable(ok({ 'content-security-policy': "script-src 'self' 'nonce-abc'" }))).toBe(false);
		expect(isKeepable(new Response(null, { status: 303, headers: { location: '/signin' } }))).toBe(false);
		expect(isKeepable(ok({}, 404))).toBe(false);
	});
});

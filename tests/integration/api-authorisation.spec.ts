// Every API route under src/routes/api, found on disk, answered for every kind of visitor.
import { describe, expect, test } from 'vitest';
import { makeEvent, throughHooks } from './support/request-event';
import { demoAccount, signedInCookies } from './support/people';
import { httpMethods, listApiRoutes } from './support/api-routes';

type Who = 'anonymous' | 'learner' | 'mentor' | 'author' | 'admin';
const everyone: Who[] = ['anonymous', 'learner', 'mentor', 'author', 'admin'];
type Expectation = { path?: string; params?: Record<string, string>; status: Record<Who, number> };

const open = { anonymous: 200, learner: 200, mentor: 200, author: 200, admin: 200 };
const signedIn = { anonymous: 401, learner: 200, mentor: 200, author: 200, admin: 200 };
const adminOnly = { anonymous: 401, learner: 403, mentor: 403, author: 403, admin: 200 };
// POSTs sent with no body: past the guard, the route refuses the missing input with a 400
const signedInNoBody = { anonymous: 401, learner: 400, mentor: 400, author: 400, admin: 400 };
const authorsNoBody = { anonymous: 401, learner: 403, mentor: 403, author: 400, admin: 400 };

/**
 * What each route must answer, per method. A route folder on disk without an entry here, or a
 * method it exports without one, fails the test: a new API route cannot be left unchecked.
 */
const expectations: Record<string, Record<string, Expectation>> = {
	'/api/health': { GET: { status: open } },
	'/api/v1/me': { GET: { status: signedIn } },
	'/api/v1/admin/people': { GET: { path: '/api/v1/admin/people?q=demo&sort=email', status: adminOnly } },
	'/api/v1/quiz-answers': { POST: { status: signedInNoBody } },
	'/api/v1/attempts': { POST: { status: signedInNoBody } },
	'/api/v1/attempts/from-uploads': { POST: { status: signedInNoBody } },
	// the resumable upload (tus): a request without the protocol's Tus-Resumable header is refused with 412, as tus says
	// and cancelling a submission the visitor has no uploads in finds nothing: 404
	'/api/v1/uploads': {
		POST: { status: { anonymous: 401, learner: 412, mentor: 412, author: 412, admin: 412 } },
		DELETE: { path: '/api/v1/uploads?submissionKey=nothing-here-0', status: { anonymous: 401, learner: 404, mentor: 404, author: 404, admin: 404 } }
	},
	// someone else's upload and a missing one answer alike: 404
	'/api/v1/uploads/[id]': Object.fromEntries(
		['HEAD', 'PATCH', 'DELETE'].map((m) => [m, { path: `/api/v1/uploads/${'0'.repeat(32)}`, params: { id: '0'.repeat(32) }, status: { anonymous: 401, learner: 404, mentor: 404, author: 404, admin: 404 } }])
	),
	// someone else's attempt and a missing one answer alike: 404
	'/api/v1/attempts/[id]': {
		GET: { path: '/api/v1/attempts/00000000-0000-4000-8000-000000000000', params: { id: '00000000-0000-4000-8000-000000000000' }, status: { anonymous: 401, learner: 404, mentor: 404, author: 404, admin: 404 } }
	},
	// someone else's certificate and a missing one answer alike: 404
	'/api/v1/credentials/[id]': {
		GET: { path: '/api/v1/credentials/00000000-0000-4000-8000-000000000000?format=pdf', params: { id: '00000000-0000-4000-8000-000000000000' }, status: { anonymous: 401, learner: 404, mentor: 404, author: 404, admin: 404 } }
	},
	'/api/v1/review-queue': { GET: { status: { anonymous: 401, learner: 403, mentor: 200, author: 403, admin: 200 } } },
	'/api/v1/author/preview': { POST: { status: authorsNoBody } },
	'/api/v1/author/spec-check': { POST: { status: authorsNoBody } },
	'/api/v1/author/images': { POST: { status: authorsNoBody } },
	'/api/v1/author/spec-trial': { POST: { status: authorsNoBody } },
	'/api/v1/author/clips': { POST: { status: authorsNoBody } },
	// a missing clip: 404 for authors, the role check first for everyone else
	'/api/v1/author/clips/[id]': Object.fromEntries(
		['GET', 'DELETE'].map((m) => [m, { path: `/api/v1/author/clips/${'0'.repeat(8)}-0000-4000-8000-${'0'.repeat(12)}`, params: { id: `${'0'.repeat(8)}-0000-4000-8000-${'0'.repeat(12)}` }, status: { anonymous: 401, learner: 403, mentor: 403, author: 404, admin: 404 } }])
	),
	// a clip's files answer by the lesson's access rule; a missing clip is missing for everyone (lesson-clips.spec covers the rest)
	'/api/v1/clips/[id]/[file]': {
		GET: { path: `/api/v1/clips/${'0'.repeat(8)}-0000-4000-8000-${'0'.repeat(12)}/720.mp4`, params: { id: `${'0'.repeat(8)}-0000-4000-8000-${'0'.repeat(12)}`, file: '720.mp4' }, status: { anonymous: 404, learner: 404, mentor: 404, author: 404, admin: 404 } }
	},
	// a private calendar feed opens by the secret in its address alone (calendar apps send no session): an unknown one is 404
	'/api/v1/calendar/[token]': { GET: { path: `/api/v1/calendar/${'x'.repeat(32)}`, params: { token: 'x'.repeat(32) }, status: { anonymous: 404, learner: 404, mentor: 404, author: 404, admin: 404 } } },
	// reports for mentors and admins; a missing field day or cohort answers 404 to them
	'/api/v1/reports/field-days/[slug]': { GET: { path: '/api/v1/reports/field-days/no-such-day', params: { slug: 'no-such-day' }, status: { anonymous: 401, learner: 403, mentor: 404, author: 403, admin: 404 } } },
	'/api/v1/reports/cohorts/[slug]': { GET: { path: '/api/v1/reports/cohorts/no-such-cohort', params: { slug: 'no-such-cohort' }, status: { anonymous: 401, learner: 403, mentor: 404, author: 403, admin: 404 } } },
	// public (the provider calls it with no session), but an unsigned request is refused whoever sends it
	'/api/v1/payments/webhook': { POST: { status: { anonymous: 400, learner: 400, mentor: 400, author: 400, admin: 400 } } }
};

const routes = listApiRoutes();

describe('API authorisation matrix', () => {
	test('the walk finds the known routes (guards the walk itself)', () => {
		expect(routes.map((r) => r.id)).toEqual(expect.arrayContaining(['/api/health', '/api/v1/me']));
	});

	test('every API route on disk has expectations, and every expectation has a route', () => {
		const onDisk = routes.map((r) => r.id).sort();
		const missing = onDisk.filter((id) => !(id in expectations));
		expect(missing, `add expectations for: ${missing.join(', ')}`).toEqual([]);
		expect(Object.keys(expectations).sort()).toEqual(onDisk);
	});

	for (const { file, id } of routes) {
		test(`${id}: each exported method is listed and answers each visitor as expected`, async () => {
			const mod: Record<string, unknown> = await import(/* @vite-ignore */ file);
			const exported = httpMethods.filter((m) => typeof mod[m] === 'function');
			const listed = Object.keys(expectations[id] ?? {});
			expect(exported.sort(), `${id}: methods exported vs. listed`).toEqual(listed.sort());

			for (const method of exported) {
				const exp = expectations[id][method];
				for (const who of everyone) {
					const cookies = who === 'anonymous' ? undefined : await signedInCookies(demoAccount(who).email);
					const event = makeEvent({ method, path: exp.path ?? id, cookies, params: exp.params, routeId: id });
					const handler = mod[method] as (e: unknown) => Response | Promise<Response>;
					const outcome = await throughHooks(event, (e) => handler(e));
					expect(outcome.kind, `${method} ${id} as ${who}`).toBe('value');
					const response = (outcome as { value: Response }).value;
					expect(response.status, `${method} ${id} as ${who}`).toBe(exp.status[who]);
					const body = await response.clone().json();
					if (response.status === 401) expect(body).toMatchObject({ error: 'unauthenticated' });
					if (response.status === 403) expect(body).toMatchObject({ error: 'forbidden' });
				}
			}
		});
	}

	test('GET /api/v1/me answers with the signed-in person and no secrets', async () => {
		const { GET } = await import('../../src/routes/api/v1/me/+server');
		const cookies = await signedInCookies(demoAccount('mentor').email);
		const outcome = await throughHooks(makeEvent({ path: '/api/v1/me', cookies }), (e) => GET(e as never));
		const body = await (outcome as { value: Response }).value.json();
		expect(body).toMatchObject({ email: demoAccount('mentor').email, roles: ['learner', 'mentor'], emailVerified: true });
		expect(JSON.stringify(body)).not.toMatch(/password|hash/i);
	});

	test('GET /api/v1/admin/people searches, sorts and pages from URL params', async () => {
		const { GET } = await import('../../src/routes/api/v1/admin/people/+server');
		const cookies = await signedInCookies(demoAccount('admin').email);
		const path = '/api/v1/admin/people?q=harborlane&sort=email&dir=desc&page=1';
		const outcome = await throughHooks(makeEvent({ path, cookies }), (e) => GET(e as never));
		const body = await (outcome as { value: Response }).value.json();
		const emails: string[] = body.people.map((p: { email: string }) => p.email);
		expect(emails).toEqual(demo4Sorted().toReversed());
		expect(body.total).toBe(4);
		expect(JSON.stringify(body)).not.toMatch(/passwordHash/);
	});

	test('a malformed people query falls back to defaults instead of failing', async () => {
		const { GET } = await import('../../src/routes/api/v1/admin/people/+server');
		const cookies = await signedInCookies(demoAccount('admin').email);
		const path = '/api/v1/admin/people?sort=drop%20table&dir=sideways&page=-3&q=%25';
		const outcome = await throughHooks(makeEvent({ path, cookies }), (e) => GET(e as never));
		const response = (outcome as { value: Response }).value;
		expect(response.status).toBe(200);
		const body = await response.json();
		expect(body.query).toEqual({ q: '%', sort: 'name', dir: 'asc', page: 1 });
		// '%' is searched for literally, not as a wildcard
		expect(body.people).toEqual([]);
	});
});

function demo4Sorted(): string[] {
	return ['admin', 'author', 'learner', 'mentor'].map((r) => `${r}@harborlane.example`).sort();
}

// The standing robustness suite, driven by walks of the routes on disk so a new route or action is covered by
// default: every form action with every role (refused for the wrong one, never a 5xx for the right one), and every
// page, action and API route with characters PostgreSQL cannot store (a clear 400, never a 5xx).
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { users, type Role } from '$lib/server/db/schema';
import { failureOf, makeEvent, throughHooks, type Outcome } from './support/request-event';
import { demoAccount, signedInCookies } from './support/people';
import { listPageRoutes } from './support/page-routes';
import { httpMethods, listApiRoutes } from './support/api-routes';
import { pointAppAt } from './support/payments';
import { ownBodyRoutes } from '$lib/server/edge/guard-input';

function uploadEvent(path: string, form: FormData, routeId: string, cookies: Awaited<ReturnType<typeof signedInCookies>> | undefined, params: Record<string, string> = {}) {
	const event = makeEvent({ method: 'POST', path, routeId, cookies, params });
	Object.assign(event, { request: new Request(event.url, { method: 'POST', body: form, headers: { origin: event.url.origin } }) });
	return event;
}

type Who = 'anonymous' | 'learner' | 'mentor' | 'author' | 'admin';
const everyone: Who[] = ['anonymous', 'learner', 'mentor', 'author', 'admin'];
type Audience = 'anyone' | 'signed-in' | Role;

/**
 * Who each form action is for. An action on disk without an entry here, or an entry without an action, fails the
 * walk: a new action cannot be left unchecked.
 */
const audiences: Record<string, Record<string, Audience>> = {
	'/(mentor)/mentor/attempts/[id]': { pin: 'mentor', unpin: 'mentor', review: 'mentor' },
	'/(learn)/account': { changeEmail: 'signed-in', changePassword: 'signed-in', resendVerification: 'signed-in', signOutEverywhere: 'signed-in' },
	'/(learn)/courses/[course]/[lesson]': { complete: 'signed-in' },
	'/(learn)/courses/[course]/[lesson]/assignments/[slug]': { filePlan: 'signed-in' },
	'/(mentor)/mentor/plans/[id=integer]': { decide: 'mentor' },
	'/(author)/author/lessons/[id=integer]': { save: 'author', publish: 'author', unpublish: 'author', settings: 'author', delete: 'author' },
	'/(author)/author/lessons/[id=integer]/history': { restore: 'author' },
	'/(author)/author/lessons/[id=integer]/assignments/new': { default: 'author' },
	'/(author)/author/lessons/new': { default: 'author' },
	'/(author)/author': { moveModule: 'author', moveLesson: 'author' },
	'/(author)/author/assignments/[id=integer]': { default: 'author' },
	'/(admin)/admin/enrolments': { grant: 'admin', setStatus: 'admin' },
	'/(admin)/admin/payments': { refund: 'admin' },
	'/(admin)/admin/people': { setRoles: 'admin' },
	'/(admin)/admin/learning-records': { retry: 'admin' },
	'/(admin)/admin/coupons': { create: 'admin' },
	'/(admin)/admin/coupons/[code]': { change: 'admin' },
	'/(public)/signout': { default: 'anyone' },
	'/(public)/signin': { default: 'anyone' },
	'/(public)/courses/[course]': { enrol: 'signed-in' },
	'/(learn)/field-days': { resetFeed: 'signed-in' },
	'/(learn)/field-days/[slug]': { book: 'signed-in', cancel: 'signed-in', acknowledge: 'signed-in' },
	'/(mentor)/mentor/field-days/[slug]': { attend: 'mentor' },
	'/(author)/author/field-days/new': { default: 'author' },
	'/(author)/author/field-days/[id=integer]': { default: 'author' },
	'/(author)/author/field-days/[id=integer]/call-off': { default: 'author' },
	'/(author)/author/cohorts': { create: 'author' },
	'/(author)/author/cohorts/[id=integer]': { addMember: 'author', removeMember: 'author', setDue: 'author', clearDue: 'author' },
	'/(public)/signup': { default: 'anyone' },
	'/(public)/verify': { default: 'anyone' },
	'/(public)/reset': { request: 'anyone', confirm: 'anyone' },
	'/(learn)/progress': { claim: 'signed-in' },
	'/(public)/verify/credential': { default: 'anyone' },
	'/(admin)/admin/credentials': { revoke: 'admin' },
	'/(author)/author/certificates': { default: 'author' }
};

/** Parameters that name nothing: allowed roles then reach "not found", and no demo data is touched. */
function missingParam(name: string, matcher: string | null): string {
	if (matcher === 'integer') return '999999';
	if (name === 'id') return '00000000-0000-4000-8000-000000000000';
	return `no-such-${name}`;
}

const roleOf: Partial<Record<Who, Role[]>> = {};
let restoreEnv: () => void;

beforeAll(async () => {
	// the payment client points nowhere: nothing in this walk may reach a real service
	restoreEnv = pointAppAt(null);
	for (const who of everyone) {
		if (who === 'anonymous') continue;
		roleOf[who] = (await db.query.users.findFirst({ where: eq(users.email, demoAccount(who).email) }))!.roles;
	}
});
afterAll(() => restoreEnv?.());

function allowed(audience: Audience, who: Who): boolean {
	if (audience === 'anyone') return true;
	if (who === 'anonymous') return false;
	return audience === 'signed-in' || roleOf[who]!.includes(audience);
}

/** Refused for who they are: an error 401/403, a redirect to sign in, or a fail(401/403). */
function refusedForRole(outcome: Outcome<unknown>): boolean {
	if (outcome.kind === 'error') return outcome.status === 401 || outcome.status === 403;
	// to the sign-in form and back (signing out also ends on /signin, with a notice: that is success)
	if (outcome.kind === 'redirect') return /^\/signin(\?redirectTo=|$)/.test(outcome.location);
	const failure = failureOf(outcome.value);
	return failure !== null && (failure.status === 401 || failure.status === 403);
}

/** The status an outcome stands for: a 5xx here is the defect this suite exists to catch. */
function statusOf(outcome: Outcome<unknown>): number {
	if (outcome.kind === 'error') return outcome.status;
	if (outcome.kind === 'redirect') return outcome.status;
	const value = outcome.value;
	if (value instanceof Response) return value.status;
	return failureOf(value)?.status ?? 200;
}

const pages = listPageRoutes();
const withActions = await Promise.all(
	pages.map(async (route) => {
		const mod = (await import(/* @vite-ignore */ route.file)) as { actions?: Record<string, (e: never) => unknown>; load?: (e: never) => unknown };
		return { route, mod };
	})
);

async function cookiesFor(who: Who) {
	return who === 'anonymous' ? undefined : await signedInCookies(demoAccount(who).email);
}

async function callAction(routeFile: (typeof withActions)[number], name: string, who: Who, form: Record<string, string>, fill = missingParam) {
	const { route, mod } = routeFile;
	const params = Object.fromEntries(route.params.map(([n, m]) => [n, fill(n, m)]));
	const event = makeEvent({ path: `${route.path(fill)}?/${name}`, form, cookies: await cookiesFor(who), params, routeId: route.id });
	try {
		return await throughHooks(event, (e) => mod.actions![name](e as never));
	} catch (e) {
		// an unexpected throw is what SvelteKit turns into a 500 page
		return { kind: 'error', status: 500, message: e instanceof Error ? e.message : String(e) } as const;
	}
}

describe('form actions with every role', () => {
	test('the walk finds the actions on disk, and every one has an audience', () => {
		const onDisk = withActions.flatMap(({ route, mod }) => Object.keys(mod.actions ?? {}).map((a) => `${route.id} ?/${a}`));
		expect(onDisk.length).toBeGreaterThanOrEqual(30);
		const listed = Object.entries(audiences).flatMap(([id, acts]) => Object.keys(acts).map((a) => `${id} ?/${a}`));
		expect(onDisk.filter((a) => !listed.includes(a)), 'add these to `audiences`').toEqual([]);
		expect(listed.filter((a) => !onDisk.includes(a)), 'listed but not on disk').toEqual([]);
	});

	for (const entry of withActions.filter(({ mod }) => mod.actions)) {
		for (const name of Object.keys(entry.mod.actions!)) {
			test(`${entry.route.id} ?/${name}: refused for the wrong role, never a 5xx for the right one`, async () => {
				const audience = audiences[entry.route.id]?.[name];
				expect(audience, 'listed in `audiences`').toBeTruthy();
				for (const who of everyone) {
					const outcome = await callAction(entry, name, who, { unknown: 'x' });
					const label = `${name} as ${who}: ${JSON.stringify(outcome).slice(0, 200)}`;
					expect(statusOf(outcome), label).toBeLessThan(500);
					expect(refusedForRole(outcome), label).toBe(!allowed(audience!, who));
				}
			});
		}
	}
});

// a lone UTF-16 half cannot even be sent in a form (it is encoded as U+FFFD on the way), only inside JSON
const hostile = ['nul\u0000byte', 'bell\u0007', 'half \uD800 pair'];
const hostileInForms = hostile.slice(0, 2);

describe('characters PostgreSQL cannot store', () => {
	for (const entry of withActions.filter(({ mod }) => mod.actions)) {
		test(`${entry.route.id}: every action refuses them in a form field with a clear 400, for every role`, async () => {
			for (const name of Object.keys(entry.mod.actions!)) {
				for (const who of everyone) {
					for (const bad of hostileInForms) {
						const form = { text: bad, name: bad, email: `a${bad}@example.com`, title: bad, body: bad, coupon: bad, token: bad, password: bad };
						const outcome = await callAction(entry, name, who, form);
						expect(outcome, `${name} as ${who} with ${JSON.stringify(bad)}`).toMatchObject({ kind: 'error', status: 400, message: expect.stringMatching(/cannot store/) });
					}
				}
			}
		});
	}

	for (const { route, mod } of withActions.filter(({ route, mod }) => mod.load && route.params.length > 0)) {
		test(`${route.id}: the page refuses them in its address with a 400`, async () => {
			for (const who of everyone) {
				const fill = (n: string) => `x${hostile[0]}${n}`;
				const params = Object.fromEntries(route.params.map(([n]) => [n, fill(n)]));
				const event = makeEvent({ path: route.path(fill), cookies: await cookiesFor(who), params, routeId: route.id });
				const outcome = await throughHooks(event, (e) => mod.load!(e as never));
				expect(outcome, who).toMatchObject({ kind: 'error', status: 400, message: expect.stringMatching(/cannot accept/) });
			}
		});
	}

	for (const route of listApiRoutes()) {
		test(`${route.id}: every method refuses them in the query, the path and a JSON body with a 400`, async () => {
			const mod: Record<string, unknown> = await import(/* @vite-ignore */ route.file);
			for (const method of httpMethods.filter((m) => typeof mod[m] === 'function')) {
				const handler = mod[method] as (e: unknown) => Response | Promise<Response>;
				const params: Record<string, string> = {};
				const path = ['/api', ...route.parts.map((p) => (/^\[/.test(p) ? (params[p.slice(1, -1).split('=')[0]] = 'x\u0000') : p))].join('/');
				const cookies = await cookiesFor('admin');
				const ownBody = ownBodyRoutes.has(route.id);
				// a request with these methods carries no body
				const bodyless = method === 'GET' || method === 'HEAD';
				const form = new FormData();
				for (const bad of hostileInForms) form.append('assignment', bad);
				form.append('alt', hostile[0]);
				form.append('file', new File([new Uint8Array([0xff, 0xd8, 0xff])], `frame${hostile[0]}.jpg`, { type: 'image/jpeg' }));
				const variants = [
					makeEvent({ method, path: `${path}?q=${encodeURIComponent(hostile[0])}`, params, routeId: route.id, cookies }),
					...(bodyless ? [] : [makeEvent({ method, path, json: { body: hostile[0], answer: hostile[2] }, params, routeId: route.id, cookies })]),
					...(bodyless || !ownBody ? [] : [uploadEvent(path, form, route.id, cookies, params)])
				];
				for (const event of variants) {
					const outcome = await throughHooks(event, (e) => handler(e));
					const label = `${method} ${event.url.pathname}${event.url.search} ${event.request.headers.get('content-type')}`;
					// routes that read their own bodies refuse a bad body themselves, with a 400 of their own
					// (unless the address itself carries the characters: the input gate refuses that first)
					if (ownBody && !event.url.search && Object.keys(params).length === 0) {
						expect(outcome.kind === 'value' && (outcome.value as Response).status, label).toBe(400);
						continue;
					}
					expect(outcome, label).toMatchObject({ kind: 'error', status: 400 });
				}
			}
		});
	}
});

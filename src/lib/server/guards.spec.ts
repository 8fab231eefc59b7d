import { describe, expect, test } from 'vitest';
import { isHttpError, isRedirect } from '@sveltejs/kit';
import { checkApiAccess, requireRole, safeRedirectPath } from './guards';

const person = (roles: string[]) =>
	({ user: { id: 'u1', email: 'a@test.example', name: 'A', emailVerified: true, roles }, session: null, roles }) as unknown as App.Locals;

describe('safeRedirectPath', () => {
	test.each([
		['/admin/people?page=2#top', '/admin/people?page=2#top'],
		['/courses', '/courses'],
		['//evil.example/path', '/courses'],
		['/\\evil.example', '/courses'],
		['https://evil.example/', '/courses'],
		['javascript:alert(1)', '/courses'],
		['', '/courses'],
		[null, '/courses'],
		['relative/path', '/courses']
	])('%s → %s', (input, expected) => {
		expect(safeRedirectPath(input)).toBe(expected);
	});
});

describe('checkApiAccess', () => {
	test('anonymous → 401 JSON, missing role → 403 JSON, holder → the user', async () => {
		const anon = checkApiAccess({ user: null, session: null, roles: [] }, 'admin');
		expect(anon.ok).toBe(false);
		if (!anon.ok) {
			expect(anon.response.status).toBe(401);
			expect(await anon.response.json()).toMatchObject({ error: 'unauthenticated' });
		}
		const learner = checkApiAccess(person(['learner']), 'admin');
		expect(learner.ok ? 200 : learner.response.status).toBe(403);
		const admin = checkApiAccess(person(['learner', 'admin']), 'admin');
		expect(admin.ok && admin.user.id).toBe('u1');
	});
});

describe('requireRole', () => {
	test('sends anonymous visitors to sign in with the way back, refuses the wrong role with 403', () => {
		const url = new URL('http://localhost/admin/audit?page=3');
		try {
			requireRole({ locals: { user: null, session: null, roles: [] }, url }, 'admin');
			expect.unreachable();
		} catch (e) {
			expect(isRedirect(e) && e.location).toBe('/signin?redirectTo=%2Fadmin%2Faudit%3Fpage%3D3');
		}
		try {
			requireRole({ locals: person(['learner']), url }, 'admin');
			expect.unreachable();
		} catch (e) {
			expect(isHttpError(e) && e.status).toBe(403);
		}
		expect(requireRole({ locals: person(['admin']), url }, 'admin').id).toBe('u1');
	});
});

// Each route group's layout guard: who gets in, who is sent to sign in (and back), who gets a 403.
import { describe, expect, test } from 'vitest';
import * as adminLayout from '../../src/routes/(admin)/+layout.server';
import * as mentorLayout from '../../src/routes/(mentor)/+layout.server';
import * as authorLayout from '../../src/routes/(author)/+layout.server';
import * as learnLayout from '../../src/routes/(learn)/+layout.server';
import { makeEvent, throughHooks } from './support/request-event';
import { demoAccount, signedInCookies } from './support/people';

type Who = 'anonymous' | 'learner' | 'mentor' | 'author' | 'admin';
const everyone: Who[] = ['anonymous', 'learner', 'mentor', 'author', 'admin'];

const groups = [
	{ name: '(admin)', load: adminLayout.load, path: '/admin/people?page=2', allowed: ['admin'] },
	{ name: '(mentor)', load: mentorLayout.load, path: '/mentor', allowed: ['mentor', 'admin'] },
	{ name: '(author)', load: authorLayout.load, path: '/author', allowed: ['author', 'admin'] },
	{ name: '(learn)', load: learnLayout.load, path: '/account', allowed: ['learner', 'mentor', 'author', 'admin'] }
];

async function visit(load: (e: never) => unknown, who: Who, path: string, params: Record<string, string> = {}) {
	const cookies = who === 'anonymous' ? undefined : await signedInCookies(demoAccount(who).email);
	return throughHooks(makeEvent({ path, cookies, params }), (e) => load(e as never));
}

describe('route group guards', () => {
	for (const group of groups) {
		test(`${group.name}: ${group.allowed.join(', ')} get in; anonymous is sent to sign in and back`, async () => {
			for (const who of everyone) {
				const outcome = await visit(group.load, who, group.path);
				if (who === 'anonymous') {
					expect(outcome, who).toEqual({ kind: 'redirect', status: 303, location: `/signin?redirectTo=${encodeURIComponent(group.path)}` });
				} else if (group.allowed.includes(who)) {
					expect(outcome.kind, who).toBe('value');
				} else {
					expect(outcome, who).toMatchObject({ kind: 'error', status: 403 });
				}
			}
		});
	}

	test('(learn): a free-preview lesson is open to anonymous visitors, a members-only path is not', async () => {
		const preview = await visit(learnLayout.load, 'anonymous', '/courses/daylight-flash-for-action/what-a-stop-is', {
			course: 'daylight-flash-for-action',
			lesson: 'what-a-stop-is'
		});
		expect(preview.kind).toBe('value');
		const missing = await visit(learnLayout.load, 'anonymous', '/courses/daylight-flash-for-action/nope', {
			course: 'daylight-flash-for-action',
			lesson: 'nope'
		});
		// an unknown lesson reaches the page, which answers 404
		expect(missing.kind).toBe('value');
	});
});

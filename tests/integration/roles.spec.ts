// Role changes by admins: guarded, logged with who and when, and they end the person's sessions.
import { afterAll, describe, expect, test } from 'vitest';
import { desc, eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { roleAudit, users } from '$lib/server/db/schema';
import { lucia, sessionCookieName } from '$lib/server/auth';
import { actions } from '../../src/routes/(admin)/admin/people/+page.server';
import { failureOf, makeEvent, throughHooks, type TestCookies } from './support/request-event';
import { demoAccount, freshLearner, removeFreshPeople, signedInCookies, userIdOf } from './support/people';

function setRoles(cookies: TestCookies | undefined, userId: string, roles: string[]) {
	const event = makeEvent({ path: '/admin/people?/setRoles', form: { userId, roles }, cookies });
	return throughHooks(event, (e) => actions.setRoles(e as never));
}

const auditFor = (userId: string) =>
	db.select().from(roleAudit).where(eq(roleAudit.targetUserId, userId)).orderBy(desc(roleAudit.id));

afterAll(removeFreshPeople);

describe('role changes', () => {
	test('an admin gives a learner the mentor role: stored, logged with who and when, sessions ended', async () => {
		const person = await freshLearner();
		const theirSession = await lucia.createSession(person.id, {});
		const admin = demoAccount('admin');
		const started = Date.now();
		const outcome = await setRoles(await signedInCookies(admin.email), person.id, ['mentor', 'learner']);
		expect(outcome).toMatchObject({ kind: 'value', value: { roles: { ok: true, userId: person.id } } });

		const row = await db.query.users.findFirst({ where: eq(users.id, person.id) });
		expect(row?.roles).toEqual(['learner', 'mentor']);
		const [entry] = await auditFor(person.id);
		expect(entry).toMatchObject({
			actorUserId: await userIdOf(admin.email),
			actorEmail: admin.email,
			targetEmail: person.email,
			rolesBefore: ['learner'],
			rolesAfter: ['learner', 'mentor']
		});
		expect(entry.changedAt.getTime()).toBeGreaterThan(started - 5_000);
		expect((await lucia.validateSession(theirSession.id)).session).toBeNull();
	});

	test('saving the same roles writes no log line and keeps sessions', async () => {
		const person = await freshLearner();
		const theirSession = await lucia.createSession(person.id, {});
		await setRoles(await signedInCookies(demoAccount('admin').email), person.id, ['learner']);
		expect(await auditFor(person.id)).toEqual([]);
		expect((await lucia.validateSession(theirSession.id)).session).not.toBeNull();
	});

	test('learners, mentors and authors cannot change roles; anonymous visitors are sent to sign in', async () => {
		const person = await freshLearner();
		for (const role of ['learner', 'mentor', 'author'] as const) {
			const outcome = await setRoles(await signedInCookies(demoAccount(role).email), person.id, ['admin']);
			expect(outcome, role).toMatchObject({ kind: 'error', status: 403 });
		}
		const anonymous = await setRoles(undefined, person.id, ['admin']);
		expect(anonymous).toMatchObject({ kind: 'redirect', status: 303 });
		expect((anonymous as { location: string }).location).toMatch(/^\/signin\?redirectTo=%2Fadmin%2Fpeople/);
		expect((await db.query.users.findFirst({ where: eq(users.id, person.id) }))?.roles).toEqual(['learner']);
		expect(await auditFor(person.id)).toEqual([]);
	});

	test('bad input is refused with a message: unknown role, no role, own admin role', async () => {
		const person = await freshLearner();
		const admin = await signedInCookies(demoAccount('admin').email);
		const unknown = failureOf(((await setRoles(admin, person.id, ['wizard'])) as { value: unknown }).value);
		expect(unknown?.status).toBe(400);
		const none = failureOf(((await setRoles(admin, person.id, [])) as { value: unknown }).value);
		expect((none?.data.roles as { text: string }).text).toBe('Pick at least one role.');
		const adminId = await userIdOf(demoAccount('admin').email);
		const self = failureOf(((await setRoles(admin, adminId, ['learner'])) as { value: unknown }).value);
		expect((self?.data.roles as { text: string }).text).toMatch(/cannot take away your own admin role/);
		expect(await auditFor(person.id)).toEqual([]);
	});

	test("an admin changing their own roles gets a new session id and the old one stops working", async () => {
		const adminEmail = demoAccount('admin').email;
		const adminId = await userIdOf(adminEmail);
		const before = (await db.query.users.findFirst({ where: eq(users.id, adminId) }))!.roles;
		const cookies = await signedInCookies(adminEmail);
		const oldId = cookies.jar.get(sessionCookieName)!;
		try {
			const outcome = await setRoles(cookies, adminId, ['learner', 'admin']);
			expect(outcome).toMatchObject({ kind: 'value', value: { roles: { ok: true } } });
			const newId = cookies.jar.get(sessionCookieName);
			expect(newId).toBeTruthy();
			expect(newId).not.toBe(oldId);
			expect((await lucia.validateSession(oldId)).session).toBeNull();
			expect((await lucia.validateSession(newId!)).user?.roles).toEqual(['learner', 'admin']);
		} finally {
			await db.update(users).set({ roles: before }).where(eq(users.id, adminId));
		}
	});
});

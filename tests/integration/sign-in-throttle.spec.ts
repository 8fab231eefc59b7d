// Sign-in: backoff per account and per address (kept in PostgreSQL), one answer for unknown accounts, cookie hygiene.
import { afterAll, describe, expect, test } from 'vitest';
import { eq, sql } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { signInThrottle } from '$lib/server/db/schema';
import { lucia, sessionCookieName } from '$lib/server/auth';
import { throttleRules } from '$lib/server/throttle';
import { actions } from '../../src/routes/(public)/signin/+page.server';
import { failureOf, makeCookies, makeEvent, throughHooks, type TestCookies } from './support/request-event';
import { freshLearner, removeFreshPeople, testAddress } from './support/people';

async function signIn(email: string, password: string, address: string, cookies: TestCookies = makeCookies()) {
	const event = makeEvent({ path: '/signin', form: { email, password, redirectTo: '/account' }, address, cookies });
	return throughHooks(event, (e) => actions.default(e as never));
}

function answerOf(outcome: Awaited<ReturnType<typeof signIn>>) {
	if (outcome.kind !== 'value') return { kind: outcome.kind };
	const failure = failureOf(outcome.value);
	const form = failure?.data.form as { message?: string; data: Record<string, unknown> } | undefined;
	return { kind: 'failure', status: failure?.status, message: form?.message, echoedPassword: form?.data.password };
}

const freeTries = throttleRules.account.free;

afterAll(removeFreshPeople);

describe('sign-in throttling', () => {
	test('an account is locked after repeated failures, even for the right password, and the lock is stored', async () => {
		const person = await freshLearner();
		const address = testAddress();
		for (let i = 0; i <= freeTries; i++) {
			expect(answerOf(await signIn(person.email, 'wrong password!', address)).status, `failure ${i + 1}`).toBe(400);
		}
		const locked = answerOf(await signIn(person.email, person.password, address));
		expect(locked.status).toBe(429);
		expect(locked.message).toMatch(/Too many failed attempts/);

		// kept in PostgreSQL: another process (or a restarted one) sees the same lock
		const row = await db.query.signInThrottle.findFirst({ where: eq(signInThrottle.key, `account:${person.email}`) });
		expect(row?.failures).toBe(freeTries + 1);
		expect(row!.lockedUntil!.getTime()).toBeGreaterThan(Date.now());

		// a different address does not help: the account key is locked
		expect(answerOf(await signIn(person.email, person.password, testAddress())).status).toBe(429);

		// when the lock has run out, the right password works and clears the count
		await db.update(signInThrottle).set({ lockedUntil: sql`now() - interval '1 second'` }).where(eq(signInThrottle.key, `account:${person.email}`));
		const ok = await signIn(person.email, person.password, address);
		expect(ok).toMatchObject({ kind: 'redirect', status: 303, location: '/account' });
		expect(await db.query.signInThrottle.findFirst({ where: eq(signInThrottle.key, `account:${person.email}`) })).toBeUndefined();
	});

	test('the wait doubles with each further failure', async () => {
		const person = await freshLearner();
		const key = `account:${person.email}`;
		const address = testAddress();
		const waits: number[] = [];
		for (let i = 0; i < freeTries + 3; i++) {
			// lift the lock between tries so each try is counted
			await db.update(signInThrottle).set({ lockedUntil: null }).where(eq(signInThrottle.key, key));
			await signIn(person.email, 'wrong password!', address);
			const row = await db.query.signInThrottle.findFirst({ where: eq(signInThrottle.key, key) });
			waits.push(row?.lockedUntil ? Math.round((row.lockedUntil.getTime() - Date.now()) / 1000) : 0);
		}
		const base = throttleRules.account.baseSeconds;
		expect(waits.slice(0, freeTries)).toEqual(Array(freeTries).fill(0));
		expect(waits.slice(freeTries).map((w) => Math.round(w / base))).toEqual([1, 2, 4]);
	});

	test('an unknown account gets the same answer as a wrong password, and is throttled the same way', async () => {
		const person = await freshLearner();
		const known = answerOf(await signIn(person.email, 'wrong password!', testAddress()));
		const unknown = answerOf(await signIn(`nobody-${Date.now()}@test.example`, 'wrong password!', testAddress()));
		expect(unknown).toEqual(known);
		expect(known.echoedPassword).toBe('');

		const ghost = `ghost-${Date.now()}@test.example`;
		const address = testAddress();
		for (let i = 0; i <= freeTries; i++) await signIn(ghost, 'guess', address);
		expect(answerOf(await signIn(ghost, 'guess', address)).status).toBe(429);
	});

	// that unknown accounts cost the same hashing as known ones is a timing: `npm run bench` measures it (sign-in-timing)

	test('one address is throttled after many failures across different accounts', async () => {
		const address = testAddress();
		for (let i = 0; i <= throttleRules.address.free; i++) {
			await signIn(`spray-${i}-${Date.now()}@test.example`, 'guess', address);
		}
		const person = await freshLearner();
		expect(answerOf(await signIn(person.email, person.password, address)).status).toBe(429);
		// the same person from elsewhere is fine
		expect((await signIn(person.email, person.password, testAddress())).kind).toBe('redirect');
	});
});

describe('sign-in session', () => {
	test('a successful sign-in sets an HttpOnly, SameSite=Lax cookie with a new session id', async () => {
		const person = await freshLearner();
		// a session id planted before sign-in must not survive it
		const planted = (await lucia.createSession(person.id, {})).id;
		const cookies = makeCookies({ [sessionCookieName]: planted });
		const outcome = await signIn(person.email, person.password, testAddress(), cookies);
		expect(outcome.kind).toBe('redirect');
		const id = cookies.jar.get(sessionCookieName);
		expect(id).toBeTruthy();
		expect(id).not.toBe(planted);
		expect((await lucia.validateSession(planted)).session).toBeNull();
		expect((await lucia.validateSession(id!)).user?.email).toBe(person.email);
		expect(cookies.options.get(sessionCookieName)).toMatchObject({ httpOnly: true, sameSite: 'lax', path: '/' });
		// tests run over http (ORIGIN is not https), so Secure is off here and on in production
		expect(cookies.options.get(sessionCookieName)?.secure).toBe(false);
	});

	test('?redirectTo= only leads to paths on this site', async () => {
		const person = await freshLearner();
		for (const [target, expected] of [
			['/admin/people?page=2', '/admin/people?page=2'],
			['//evil.example/x', '/courses'],
			['https://evil.example/', '/courses']
		]) {
			const event = makeEvent({ path: '/signin', form: { email: person.email, password: person.password, redirectTo: target }, address: testAddress() });
			const outcome = await throughHooks(event, (e) => actions.default(e as never));
			expect(outcome).toMatchObject({ kind: 'redirect', location: expected });
		}
	});
});

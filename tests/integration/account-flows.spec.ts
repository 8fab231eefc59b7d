// Sign-up with e-mail verification, change of address and of password, signing out everywhere.
import { afterAll, describe, expect, test } from 'vitest';
import { eq } from 'drizzle-orm';
import { randomBytes } from 'node:crypto';
import { db } from '$lib/server/db';
import { users } from '$lib/server/db/schema';
import { lucia, sessionCookieName } from '$lib/server/auth';
import { signInWithPassword } from '$lib/server/accounts';
import * as signup from '../../src/routes/(public)/signup/+page.server';
import * as verify from '../../src/routes/(public)/verify/+page.server';
import * as account from '../../src/routes/(learn)/account/+page.server';
import { failureOf, makeCookies, makeEvent, throughHooks, type TestCookies } from './support/request-event';
import { freshLearner, removeFreshPeople, testAddress } from './support/people';
import { linkIn, waitForMail } from './support/mail';

afterAll(removeFreshPeople);
const signedUp: string[] = [];
afterAll(async () => {
	for (const email of signedUp) await db.delete(users).where(eq(users.email, email));
});

const uniqueEmail = () => `s-${randomBytes(5).toString('hex')}@test.example`;

async function confirmLink(token: string, cookies = makeCookies()) {
	const event = makeEvent({ path: `/verify?token=${token}`, form: { token }, cookies });
	return throughHooks(event, (e) => verify.actions.default(e as never));
}

async function accountAction(name: keyof typeof account.actions, cookies: TestCookies, form: Record<string, string> = {}) {
	const event = makeEvent({ path: `/account?/${name}`, form, cookies, address: testAddress() });
	const action = account.actions[name] as (e: never) => unknown;
	return throughHooks(event, (e) => action(e as never));
}

describe('sign-up and e-mail verification', () => {
	test('signing up mails a link that verifies the address once and signs in; the form itself signs nobody in', async () => {
		const email = uniqueEmail();
		signedUp.push(email);
		const cookies = makeCookies();
		const event = makeEvent({ path: '/signup', form: { name: 'Ada Field', email: email.toUpperCase(), password: 'strobe in the rain' }, cookies });
		const outcome = await throughHooks(event, (e) => signup.actions.default(e as never));
		expect(outcome).toMatchObject({ kind: 'redirect', location: '/signup/sent' });
		expect(cookies.jar.has(sessionCookieName)).toBe(false);

		const row = await db.query.users.findFirst({ where: eq(users.email, email) });
		expect(row).toMatchObject({ name: 'Ada Field', emailVerified: false, roles: ['learner'] });
		expect(row!.passwordHash).toMatch(/^\$argon2id\$/);

		const mail = await waitForMail(email, /Confirm your e-mail/);
		expect(mail.text).toContain('Ada Field');
		expect(mail.html).toContain('Confirm my address');
		const token = linkIn(mail, '/verify').searchParams.get('token')!;

		const page = await throughHooks(makeEvent({ path: `/verify?token=${token}` }), (e) => verify.load(e as never));
		expect(page).toMatchObject({ kind: 'value', value: { link: { purpose: 'verify_email', email } } });

		const browser = makeCookies();
		expect(await confirmLink(token, browser)).toMatchObject({ kind: 'value', value: { confirmed: { purpose: 'verify_email', email } } });
		expect((await db.query.users.findFirst({ where: eq(users.email, email) }))?.emailVerified).toBe(true);
		expect((await lucia.validateSession(browser.jar.get(sessionCookieName)!)).user?.email).toBe(email);

		const again = failureOf(((await confirmLink(token)) as { value: unknown }).value);
		expect(again?.status).toBe(400);
		expect(again?.data.message).toMatch(/expired or has been used/);
	});

	test('bad sign-up input gets a message per field and stores nothing', async () => {
		const email = uniqueEmail();
		const event = makeEvent({ path: '/signup', form: { name: ' ', email: 'not-an-address', password: 'short' } });
		const outcome = await throughHooks(event, (e) => signup.actions.default(e as never));
		const errors = (failureOf((outcome as { value: unknown }).value)?.data.form as { errors: Record<string, string[]> }).errors;
		expect(errors.name).toEqual(['Tell us your name.']);
		expect(errors.email).toEqual(['That does not look like an e-mail address.']);
		expect(errors.password).toEqual(['Use at least 10 characters.']);
		expect(await db.query.users.findFirst({ where: eq(users.email, email) })).toBeUndefined();
	});
});

describe('account changes', () => {
	test('changing the e-mail address needs the password and the new inbox; the old one is told', async () => {
		const person = await freshLearner();
		const cookies = makeCookies({ [sessionCookieName]: (await lucia.createSession(person.id, {})).id });
		const newEmail = uniqueEmail();

		const wrong = await accountAction('changeEmail', cookies, { newEmail, password: 'not my password' });
		const wrongErrors = (failureOf((wrong as { value: unknown }).value)?.data.form as { errors: Record<string, string[]> }).errors;
		expect(wrongErrors.password).toEqual(['That is not your current password.']);

		const asked = await accountAction('changeEmail', cookies, { newEmail, password: person.password });
		expect(asked.kind).toBe('value');
		// nothing changes until the new inbox confirms
		expect((await db.query.users.findFirst({ where: eq(users.id, person.id) }))?.email).toBe(person.email);

		const token = linkIn(await waitForMail(newEmail, /new e-mail address/), '/verify').searchParams.get('token')!;
		expect(await confirmLink(token)).toMatchObject({ kind: 'value', value: { confirmed: { purpose: 'change_email', email: newEmail } } });
		const row = await db.query.users.findFirst({ where: eq(users.id, person.id) });
		expect(row).toMatchObject({ email: newEmail, emailVerified: true });
		const notice = await waitForMail(person.email, /e-mail address was changed/);
		expect(notice.text).toContain(newEmail);
		expect((await signInWithPassword(newEmail, person.password, testAddress())).ok).toBe(true);
	});

	test('changing the password ends other sessions and keeps this browser signed in with a new session', async () => {
		const person = await freshLearner();
		const elsewhere = await lucia.createSession(person.id, {});
		const here = (await lucia.createSession(person.id, {})).id;
		const cookies = makeCookies({ [sessionCookieName]: here });
		const outcome = await accountAction('changePassword', cookies, { currentPassword: person.password, newPassword: 'a brand new passphrase' });
		expect(outcome).toMatchObject({ kind: 'value', value: { form: { message: expect.stringMatching(/password is changed/) } } });
		expect((await lucia.validateSession(elsewhere.id)).session).toBeNull();
		expect((await lucia.validateSession(here)).session).toBeNull();
		const fresh = cookies.jar.get(sessionCookieName)!;
		expect((await lucia.validateSession(fresh)).user?.id).toBe(person.id);
		expect((await signInWithPassword(person.email, 'a brand new passphrase', testAddress())).ok).toBe(true);
	});

	test('signing out everywhere ends every session of the person, and only theirs', async () => {
		const person = await freshLearner();
		const other = await freshLearner();
		const theirs = await lucia.createSession(other.id, {});
		const phone = await lucia.createSession(person.id, {});
		const cookies = makeCookies({ [sessionCookieName]: (await lucia.createSession(person.id, {})).id });
		const outcome = await accountAction('signOutEverywhere', cookies);
		expect(outcome).toMatchObject({ kind: 'redirect', location: '/signin?notice=signed-out-everywhere' });
		expect(await lucia.getUserSessions(person.id)).toEqual([]);
		expect((await lucia.validateSession(phone.id)).session).toBeNull();
		expect(cookies.jar.has(sessionCookieName)).toBe(false);
		expect((await lucia.validateSession(theirs.id)).session).not.toBeNull();
	});

	test('account actions need a signed-in person', async () => {
		const outcome = await accountAction('signOutEverywhere', makeCookies());
		expect(outcome).toMatchObject({ kind: 'redirect', location: '/signin?redirectTo=%2Faccount%3F%2FsignOutEverywhere' });
	});
});

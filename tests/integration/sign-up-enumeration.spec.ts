// Sign-up tells nobody whether an address has an account: the same answer for a new and a taken address; only the
// e-mail to that address says which.
import { afterAll, describe, expect, test } from 'vitest';
import { eq } from 'drizzle-orm';
import { randomBytes } from 'node:crypto';
import { db } from '$lib/server/db';
import { users } from '$lib/server/db/schema';
import { sessionCookieName } from '$lib/server/auth';
import { backgroundMailDrained } from '$lib/server/mail';
import { listMail, readMail } from '$lib/server/mailbox';
import { throttleRules } from '$lib/server/throttle';
import * as signup from '../../src/routes/(public)/signup/+page.server';
import * as verify from '../../src/routes/(public)/verify/+page.server';
import { makeCookies, makeEvent, throughHooks } from './support/request-event';
import { freshLearner, removeFreshPeople, testAddress } from './support/people';

afterAll(removeFreshPeople);
const signedUp: string[] = [];
afterAll(async () => {
	for (const email of signedUp) await db.delete(users).where(eq(users.email, email));
});

const uniqueEmail = () => `su-${randomBytes(5).toString('hex')}@test.example`;

async function submitSignUp(form: Record<string, string>) {
	const cookies = makeCookies();
	const event = makeEvent({ path: '/signup', form, cookies, address: testAddress() });
	const outcome = await throughHooks(event, (e) => signup.actions.default(e as never));
	return { outcome, cookies };
}

/** Every message the fake SMTP server holds for `to`, once the mail sent after the answer has gone. */
async function mailTo(to: string) {
	await backgroundMailDrained();
	const list = (await listMail()).filter((m) => m.to.includes(to));
	return Promise.all(list.map(async (m) => (await readMail(m.id))!));
}

describe('sign-up with a new address and with a taken one', () => {
	test('the same answer (status, page, no session) for both; the mail to each address says which it was', async () => {
		const owner = await freshLearner('the owner passphrase');
		const newcomer = uniqueEmail();
		signedUp.push(newcomer);
		const before = await db.query.users.findFirst({ where: eq(users.id, owner.id) });

		const taken = await submitSignUp({ name: 'Someone Else', email: owner.email.toUpperCase(), password: 'an intruder passphrase' });
		const fresh = await submitSignUp({ name: 'Ola Brand', email: newcomer, password: 'a newcomer passphrase' });

		// one answer: a redirect to the same "check your inbox" page, nobody signed in
		expect(fresh.outcome).toEqual({ kind: 'redirect', status: 303, location: '/signup/sent' });
		expect(taken.outcome).toEqual(fresh.outcome);
		expect(fresh.cookies.jar.has(sessionCookieName)).toBe(false);
		expect(taken.cookies.jar.has(sessionCookieName)).toBe(false);
		expect([...taken.cookies.jar.keys()]).toEqual([...fresh.cookies.jar.keys()]);

		// the existing account is untouched
		expect(await db.query.users.findFirst({ where: eq(users.id, owner.id) })).toEqual(before);
		expect(await db.query.users.findFirst({ where: eq(users.email, newcomer) })).toMatchObject({ name: 'Ola Brand', emailVerified: false });

		// the owner is told, once, and gets a way in; no confirmation link to an account they already have
		const toOwner = await mailTo(owner.email);
		expect(toOwner.map((m) => m.subject)).toEqual(['Someone tried to create a Stopwise account with your address']);
		expect(toOwner[0].text).toContain('You already have one, so nothing was created and nothing changed.');
		expect(toOwner[0].text).toMatch(/Sign in: https?:\/\/[^\s]+\/signin/);
		expect(toOwner[0].text).not.toContain('/verify?token=');

		// the newcomer gets the confirmation link, once
		const toNewcomer = await mailTo(newcomer);
		expect(toNewcomer.map((m) => m.subject)).toEqual(['Confirm your e-mail address for Stopwise']);
		expect(toNewcomer[0].text).toMatch(/\/verify\?token=[\w-]+/);
	});

	test('bad input is refused the same way for a new and a taken address (the form, not the account, decides)', async () => {
		const owner = await freshLearner();
		const taken = await submitSignUp({ name: 'Someone Else', email: owner.email, password: 'short' });
		const fresh = await submitSignUp({ name: 'Someone Else', email: uniqueEmail(), password: 'short' });
		const errorsOf = (o: typeof taken.outcome) =>
			((o as { value: { status: number; data: { form: { errors: unknown } } } }).value);
		expect(errorsOf(taken.outcome).status).toBe(400);
		expect(errorsOf(taken.outcome).data.form.errors).toEqual(errorsOf(fresh.outcome).data.form.errors);
	});

	test('the confirmation link signs the newcomer in and goes back to the page they signed up from', async () => {
		const newcomer = uniqueEmail();
		signedUp.push(newcomer);
		const course = '/courses/daylight-flash-for-action';
		const { outcome } = await submitSignUp({ name: 'Ola Brand', email: newcomer, password: 'a newcomer passphrase', redirectTo: course });
		expect(outcome).toEqual({ kind: 'redirect', status: 303, location: '/signup/sent' });

		const [mail] = await mailTo(newcomer);
		const link = new URL(mail.text.match(/https?:\/\/[^\s]+\/verify\?[^\s]+/)![0]);
		expect(link.searchParams.get('redirectTo')).toBe(course);
		const cookies = makeCookies();
		const confirmed = await throughHooks(
			makeEvent({ path: `${link.pathname}${link.search}`, form: { token: link.searchParams.get('token')! }, cookies }),
			(e) => verify.actions.default(e as never)
		);
		expect(confirmed).toEqual({ kind: 'redirect', status: 303, location: course });
		expect(cookies.jar.has(sessionCookieName)).toBe(true);
		expect((await db.query.users.findFirst({ where: eq(users.email, newcomer) }))?.emailVerified).toBe(true);
	});

	test("repeated sign-ups with someone's address do not fill their inbox", async () => {
		const owner = await freshLearner();
		const tries = throttleRules.notice.free + 4;
		for (let i = 0; i < tries; i++) {
			const { outcome } = await submitSignUp({ name: 'Pest', email: owner.email, password: `a pest passphrase ${i}` });
			expect(outcome).toEqual({ kind: 'redirect', status: 303, location: '/signup/sent' });
		}
		const notices = await mailTo(owner.email);
		expect(notices.length).toBeGreaterThanOrEqual(1);
		expect(notices.length).toBeLessThanOrEqual(throttleRules.notice.free + 1);
	});
});

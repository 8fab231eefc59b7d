// Password reset end to end through the fake SMTP server: the link works once, expires, ends sessions.
import { afterAll, describe, expect, test } from 'vitest';
import { eq, sql } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { authTokens } from '$lib/server/db/schema';
import { lucia } from '$lib/server/auth';
import { signInWithPassword } from '$lib/server/accounts';
import { requestPasswordReset } from '$lib/server/account-links';
import { listMail } from '$lib/server/mailbox';
import { backgroundMailDrained } from '$lib/server/mail';
import { actions, load } from '../../src/routes/(public)/reset/+page.server';
import { failureOf, makeEvent, origin, throughHooks } from './support/request-event';
import { freshLearner, removeFreshPeople, testAddress } from './support/people';
import { linkIn, waitForMail } from './support/mail';

async function requestReset(email: string) {
	const event = makeEvent({ path: '/reset?/request', form: { email } });
	return throughHooks(event, (e) => actions.request(e as never));
}

async function confirmReset(token: string, password: string) {
	const event = makeEvent({ path: `/reset?/confirm&token=${token}`, form: { token, password } });
	return throughHooks(event, (e) => actions.confirm(e as never));
}

async function mailedToken(email: string): Promise<string> {
	const mail = await waitForMail(email, /new Stopwise password/);
	expect(mail.html).toContain('Choose a new password');
	const link = linkIn(mail, '/reset');
	expect(link.origin).toBe(origin);
	return link.searchParams.get('token')!;
}

afterAll(removeFreshPeople);

describe('password reset', () => {
	test('the mailed link sets a new password once; using it again fails', async () => {
		const person = await freshLearner();
		const oldSession = await lucia.createSession(person.id, {});
		const asked = await requestReset(person.email);
		expect(asked.kind).toBe('value');
		const token = await mailedToken(person.email);

		const page = await throughHooks(makeEvent({ path: `/reset?token=${token}` }), (e) => load(e as never));
		expect(page).toMatchObject({ kind: 'value', value: { hasToken: true, linkUsable: true } });

		const first = await confirmReset(token, 'first new passphrase');
		expect(first).toMatchObject({ kind: 'redirect', status: 303, location: '/signin?notice=password-changed' });

		const second = await confirmReset(token, 'second new passphrase');
		expect(second.kind).toBe('value');
		const failure = failureOf((second as { value: unknown }).value);
		expect(failure?.status).toBe(400);
		expect((failure?.data.form as { message: string }).message).toMatch(/expired or has been used/);

		// the first reset holds; the replayed one changed nothing
		expect((await signInWithPassword(person.email, 'first new passphrase', testAddress())).ok).toBe(true);
		expect((await signInWithPassword(person.email, 'second new passphrase', testAddress())).ok).toBe(false);
		expect((await signInWithPassword(person.email, person.password, testAddress())).ok).toBe(false);
		// sessions from before the reset are over
		expect((await lucia.validateSession(oldSession.id)).session).toBeNull();
		// and the page now says the link is spent
		const after = await throughHooks(makeEvent({ path: `/reset?token=${token}` }), (e) => load(e as never));
		expect(after).toMatchObject({ kind: 'value', value: { linkUsable: false } });
	});

	test('an expired link does not work', async () => {
		const person = await freshLearner();
		await requestReset(person.email);
		const token = await mailedToken(person.email);
		await db.update(authTokens).set({ expiresAt: sql`now() - interval '1 minute'` }).where(eq(authTokens.userId, person.id));
		const outcome = await confirmReset(token, 'too late passphrase');
		expect(failureOf((outcome as { value: unknown }).value)?.status).toBe(400);
		expect((await signInWithPassword(person.email, person.password, testAddress())).ok).toBe(true);
	});

	test('asking for a new link retires the older one', async () => {
		const person = await freshLearner();
		await requestReset(person.email);
		const older = await mailedToken(person.email);
		// the one-a-minute spacing would swallow an immediate second request: age the first
		await db.update(authTokens).set({ createdAt: sql`now() - interval '2 minutes'` }).where(eq(authTokens.userId, person.id));
		await backgroundMailDrained();
		const before = (await listMail()).length;
		await requestPasswordReset(person.email, origin);
		await backgroundMailDrained();
		expect((await listMail()).length).toBe(before + 1);
		expect(failureOf(((await confirmReset(older, 'older link passphrase')) as { value: unknown }).value)?.status).toBe(400);
	});

	test('an unknown address gets the same answer and no mail', async () => {
		const person = await freshLearner();
		const ghost = `ghost-${Date.now()}@test.example`;
		const known = (await requestReset(person.email)) as { value: { form: { message: string } } };
		const unknown = (await requestReset(ghost)) as { value: { form: { message: string } } };
		expect(unknown.value.form.message.replace(ghost, 'X')).toBe(known.value.form.message.replace(person.email, 'X'));
		await requestPasswordReset(ghost, origin);
		// the form's own request runs after its answer: wait for it, or a late mail would go unseen
		await backgroundMailDrained();
		expect((await listMail()).some((m) => m.to.includes(ghost))).toBe(false);
		expect((await listMail()).filter((m) => m.to.includes(person.email))).toHaveLength(1);
	});

	test('a too-short new password is refused next to the field, and the link stays usable', async () => {
		const person = await freshLearner();
		await requestReset(person.email);
		const token = await mailedToken(person.email);
		const outcome = await confirmReset(token, 'short');
		const failure = failureOf((outcome as { value: unknown }).value);
		expect(failure?.status).toBe(400);
		expect((failure?.data.form as { errors: Record<string, string[]> }).errors.password).toEqual(['Use at least 10 characters.']);
		expect(await confirmReset(token, 'long enough passphrase')).toMatchObject({ kind: 'redirect' });
	});
});

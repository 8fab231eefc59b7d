// E-mailed one-time links: verify an address, reset a password, move the account to a new address.
import { and, eq, ne } from 'drizzle-orm';
import { db } from './db';
import { users, type TokenPurpose } from './db/schema';
import { consumeToken, issueToken, lastIssuedAt, peekToken, tokenLifetimeMinutes } from './tokens';
import { sendInBackground, sendLetter, type SendResult } from './mail';
import {
	changeEmailLetter,
	emailChangedNotice,
	existingAccountLetter,
	passwordChangedNotice,
	resetPasswordLetter,
	verifyEmailLetter
} from './mail-letters';
import { endAllSessions } from './auth';
import { hashPassword } from './password';
import { clearFailures, recordFailure, secondsUntilUnlocked, throttleKeysFor } from './throttle';
import { findUserByEmail } from './accounts';

/** Do not send the same kind of mail to one person more often than this. */
const resendSpacingMs = 60_000;

const hours = (p: TokenPurpose) => Math.round(tokenLifetimeMinutes[p] / 60);

/** `back`: a safe path the confirmation page goes on to (the page the visitor was on when they signed up). */
export async function sendVerificationMail(
	user: { id: string; email: string; name: string },
	origin: string,
	back = ''
): Promise<SendResult> {
	const token = await issueToken(user.id, 'verify_email', user.email);
	const href = `${origin}/verify?token=${token}${back ? `&redirectTo=${encodeURIComponent(back)}` : ''}`;
	return sendLetter(verifyEmailLetter(user.email, user.name, href, hours('verify_email')));
}

/** Resend, at most once a minute. */
export async function resendVerificationMail(
	user: { id: string; email: string; name: string },
	origin: string
): Promise<SendResult | { ok: false; reason: string }> {
	const last = await lastIssuedAt(user.id, 'verify_email');
	if (last && Date.now() - last.getTime() < resendSpacingMs) {
		return { ok: false, reason: 'We sent a link less than a minute ago. Check your inbox (and spam folder) first.' };
	}
	return sendVerificationMail(user, origin);
}

/**
 * Answers the same whether or not the address has an account; the work runs after the answer
 * so the response time does not tell either.
 */
export function requestPasswordReset(email: string, origin: string): Promise<void> {
	const work = (async () => {
		const user = await findUserByEmail(email);
		if (!user) return;
		const last = await lastIssuedAt(user.id, 'reset_password');
		if (last && Date.now() - last.getTime() < resendSpacingMs) return;
		const token = await issueToken(user.id, 'reset_password', user.email);
		const href = `${origin}/reset?token=${token}`;
		await sendLetter(resetPasswordLetter(user.email, user.name, href, tokenLifetimeMinutes.reset_password));
	})().catch((e) => console.error('[reset] request failed', e));
	return work;
}

/**
 * After a sign-up form: the account's owner hears of it by e-mail, a new address gets its confirmation link. Runs
 * after the answer, which is the same either way, so neither the page nor its timing says whether the address
 * has an account.
 */
export function mailAfterSignUp(
	outcome: { created: true; user: { id: string; email: string; name: string } } | { created: false; email: string },
	origin: string,
	back = ''
): void {
	sendInBackground('sign-up mail', async () => {
		if (outcome.created) {
			await sendVerificationMail(outcome.user, origin, back);
			return;
		}
		const owner = await findUserByEmail(outcome.email);
		if (!owner) return;
		// the form can be sent by anyone: it must not become a way to fill someone's inbox
		const keys = [{ kind: 'notice' as const, key: `signup-notice:${owner.email}` }];
		if ((await secondsUntilUnlocked(keys)) > 0) return;
		await recordFailure(keys);
		const signIn = `${origin}/signin${back ? `?redirectTo=${encodeURIComponent(back)}` : ''}`;
		await sendLetter(existingAccountLetter(owner.email, owner.name, signIn));
	});
}

/** Which link this is, while it is still usable: for the confirm pages. */
export async function describeLink(token: string, purposes: TokenPurpose[]) {
	for (const purpose of purposes) {
		const row = await peekToken(token, purpose);
		if (row) return { purpose, email: row.email };
	}
	return null;
}

/** Uses a reset link: new password, every session ended, address counted as verified. Null if the link is spent. */
export async function resetPassword(token: string, newPassword: string): Promise<{ userId: string } | null> {
	const passwordHash = await hashPassword(newPassword);
	const done = await db.transaction(async (tx) => {
		const row = await consumeToken(tx, token, 'reset_password');
		if (!row) return null;
		const [user] = await tx
			.update(users)
			.set({ passwordHash })
			.where(eq(users.id, row.userId))
			.returning({ id: users.id, email: users.email, name: users.name });
		// the link reached the inbox, so the address is proven (if it is still the account's address)
		if (user.email === row.email) await tx.update(users).set({ emailVerified: true }).where(eq(users.id, user.id));
		await endAllSessions(user.id, tx);
		return user;
	});
	if (!done) return null;
	await clearFailures(throttleKeysFor(done.email, ''));
	await sendLetter(passwordChangedNotice(done.email, done.name));
	return { userId: done.id };
}

export type ConfirmResult =
	| { ok: true; purpose: 'verify_email' | 'change_email'; email: string; userId: string }
	| { ok: false; message: string };

/** Uses a verification or change-of-address link. */
export async function confirmAddress(token: string): Promise<ConfirmResult> {
	const spent = { ok: false, message: 'This link has expired or has been used already.' } as const;
	const verified = await db.transaction(async (tx) => {
		const row = await consumeToken(tx, token, 'verify_email');
		if (!row) return null;
		await tx
			.update(users)
			.set({ emailVerified: true })
			.where(and(eq(users.id, row.userId), eq(users.email, row.email)));
		return row;
	});
	if (verified) return { ok: true, purpose: 'verify_email', email: verified.email, userId: verified.userId };

	const moved = await db.transaction(async (tx) => {
		const row = await consumeToken(tx, token, 'change_email');
		if (!row) return null;
		const taken = await tx.query.users.findFirst({ where: and(eq(users.email, row.email), ne(users.id, row.userId)) });
		if (taken) return { taken: true as const };
		const [before] = await tx.select({ email: users.email, name: users.name }).from(users).where(eq(users.id, row.userId));
		await tx.update(users).set({ email: row.email, emailVerified: true }).where(eq(users.id, row.userId));
		return { taken: false as const, oldEmail: before.email, name: before.name, newEmail: row.email, userId: row.userId };
	}).catch((e: unknown) => {
		// someone signed up with the address between our check and the update (unique index)
		if ((e as { code?: string })?.code === '23505') return { taken: true as const };
		throw e;
	});
	if (!moved) return spent;
	if (moved.taken) return { ok: false, message: 'Another account uses that address now, so it cannot be moved to it.' };
	await sendLetter(emailChangedNotice(moved.oldEmail, moved.name, moved.newEmail));
	return { ok: true, purpose: 'change_email', email: moved.newEmail, userId: moved.userId };
}

export type EmailChangeResult = { ok: true } | { ok: false; field: 'newEmail' | 'password'; message: string };

/** Sends a confirmation link to the new address; the account keeps the old one until it is used. */
export async function requestEmailChange(
	user: { id: string; email: string; name: string },
	newEmail: string,
	origin: string
): Promise<EmailChangeResult> {
	if (newEmail === user.email) return { ok: false, field: 'newEmail', message: 'That is already your address.' };
	if (await findUserByEmail(newEmail)) {
		return { ok: false, field: 'newEmail', message: 'Another account uses that address.' };
	}
	const token = await issueToken(user.id, 'change_email', newEmail);
	const sent = await sendLetter(changeEmailLetter(newEmail, user.name, `${origin}/verify?token=${token}`, hours('change_email')));
	if (!sent.ok) return { ok: false, field: 'newEmail', message: `${sent.reason} Please try again in a few minutes.` };
	return { ok: true };
}

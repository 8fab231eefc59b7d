// Sign-up, sign-in with throttling, and password change: the account rules, without any page or cookie.
import { randomBytes } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { db } from './db';
import { users } from './db/schema';
import { hashPassword, verifyPassword } from './password';
import { clearFailures, recordFailure, secondsUntilUnlocked, throttleKeysFor } from './throttle';
import { endAllSessions } from './auth';

export type SignInResult =
	| { ok: true; userId: string }
	| { ok: false; reason: 'invalid' }
	| { ok: false; reason: 'throttled'; retryAfterSeconds: number };

/** Unknown accounts are checked against this, so they cost the same argon2 work as known ones. */
const dummyHash = hashPassword(randomBytes(18).toString('base64url'));

export function findUserByEmail(email: string) {
	return db.query.users.findFirst({ where: eq(users.email, email.trim().toLowerCase()) });
}

/** Same answer and the same hashing work whether or not the account exists; locked keys skip the check. */
export async function signInWithPassword(email: string, password: string, address: string): Promise<SignInResult> {
	const keys = throttleKeysFor(email, address);
	const wait = await secondsUntilUnlocked(keys);
	if (wait > 0) return { ok: false, reason: 'throttled', retryAfterSeconds: wait };
	const user = await findUserByEmail(email);
	const valid = await verifyPassword(user?.passwordHash ?? (await dummyHash), password);
	if (!user || !user.passwordHash || !valid) {
		await recordFailure(keys);
		return { ok: false, reason: 'invalid' };
	}
	await clearFailures(keys);
	return { ok: true, userId: user.id };
}

export type SignUpResult = { ok: true; userId: string } | { ok: false; field: 'email'; message: string };

export async function signUp(input: { name: string; email: string; password: string }): Promise<SignUpResult> {
	const passwordHash = await hashPassword(input.password);
	const [row] = await db
		.insert(users)
		.values({
			id: randomBytes(15).toString('base64url'),
			email: input.email,
			name: input.name,
			passwordHash,
			emailVerified: false,
			roles: ['learner']
		})
		.onConflictDoNothing({ target: users.email })
		.returning({ id: users.id });
	if (!row) {
		return { ok: false, field: 'email', message: 'An account with this address exists already. Sign in, or reset its password.' };
	}
	return { ok: true, userId: row.id };
}

export type ChangePasswordResult =
	| { ok: true }
	| { ok: false; field: 'currentPassword'; message: string };

/** Checks the current password (throttled like sign-in), stores the new one and ends every session. */
export async function changePassword(
	userId: string,
	currentPassword: string,
	newPassword: string,
	address: string
): Promise<ChangePasswordResult> {
	const check = await confirmPassword(userId, currentPassword, address);
	if (!check.ok) return { ok: false, field: 'currentPassword', message: check.message };
	const passwordHash = await hashPassword(newPassword);
	await db.transaction(async (tx) => {
		await tx.update(users).set({ passwordHash }).where(eq(users.id, userId));
		await endAllSessions(userId, tx);
	});
	return { ok: true };
}

/** Re-asks a signed-in person's password before a sensitive change; failures count toward the throttle. */
export async function confirmPassword(
	userId: string,
	password: string,
	address: string
): Promise<{ ok: true; email: string; name: string } | { ok: false; message: string }> {
	const user = await db.query.users.findFirst({ where: eq(users.id, userId) });
	if (!user) return { ok: false, message: 'Your account was not found.' };
	const result = await signInWithPassword(user.email, password, address);
	if (result.ok) return { ok: true, email: user.email, name: user.name };
	if (result.reason === 'throttled') return { ok: false, message: throttledMessage(result.retryAfterSeconds) };
	return { ok: false, message: 'That is not your current password.' };
}

export function throttledMessage(seconds: number): string {
	const wait = seconds >= 90 ? `${Math.ceil(seconds / 60)} minutes` : `${seconds} seconds`;
	return `Too many failed attempts. Please wait ${wait} and try again, or reset your password.`;
}

// Throttling of guesses (sign-in passwords, coupon codes) in PostgreSQL (survives restarts, shared by every process): backoff after repeated failures.
import { inArray, sql } from 'drizzle-orm';
import { db } from './db';
import { signInThrottle } from './db/schema';

type Rule = { free: number; baseSeconds: number; capSeconds: number };

/**
 * An account gets a few tries, then waits 15 s, 30 s, 60 s … up to 15 min. An address (one IP)
 * gets more before it waits, because a club or office shares one address.
 * Common practice, no published source.
 */
export const throttleRules: Record<'account' | 'address' | 'coupon' | 'notice', Rule> = {
	account: { free: 5, baseSeconds: 15, capSeconds: 15 * 60 },
	address: { free: 30, baseSeconds: 15, capSeconds: 15 * 60 },
	// wrong coupon codes, per learner: guessing codes is guessing passwords to a discount
	coupon: { free: 5, baseSeconds: 15, capSeconds: 15 * 60 },
	// mails the sign-up form makes us send to someone else's inbox: a few, then further ones wait
	notice: { free: 2, baseSeconds: 60, capSeconds: 60 * 60 }
};

/** Failures older than this are forgotten. */
const forgetAfter = sql`interval '1 hour'`;

export type ThrottleKey = { kind: keyof typeof throttleRules; key: string };

export function throttleKeysFor(email: string, address: string): ThrottleKey[] {
	return [
		{ kind: 'account', key: `account:${email.trim().toLowerCase()}` },
		{ kind: 'address', key: `address:${address}` }
	];
}

/** Coupon guesses: per learner and per address, in keys of their own (a wrong code never locks sign-in). */
export function couponThrottleKeysFor(userId: string, address: string): ThrottleKey[] {
	return [
		{ kind: 'coupon', key: `coupon-user:${userId}` },
		{ kind: 'address', key: `coupon-address:${address}` }
	];
}

/** Seconds until the longest lock among the keys ends; 0 when none is locked. */
export async function secondsUntilUnlocked(keys: ThrottleKey[]): Promise<number> {
	const rows = await db
		.select({
			wait: sql<number>`greatest(0, ceil(extract(epoch from (${signInThrottle.lockedUntil} - now()))))::int`
		})
		.from(signInThrottle)
		.where(
			inArray(
				signInThrottle.key,
				keys.map((k) => k.key)
			)
		);
	return Math.max(0, ...rows.map((r) => r.wait ?? 0));
}

/** Counts one failure on each key and sets its lock: one atomic upsert per key, safe across processes. */
export async function recordFailure(keys: ThrottleKey[]): Promise<void> {
	for (const { kind, key } of keys) {
		const { free, baseSeconds, capSeconds } = throttleRules[kind];
		const failures = sql`(CASE WHEN ${signInThrottle.lastFailureAt} < now() - ${forgetAfter} THEN 1 ELSE ${signInThrottle.failures} + 1 END)`;
		await db
			.insert(signInThrottle)
			.values({ key, failures: 1 })
			.onConflictDoUpdate({
				target: signInThrottle.key,
				set: {
					failures,
					lastFailureAt: sql`now()`,
					lockedUntil: sql`CASE WHEN ${failures} > ${free}
						THEN now() + make_interval(secs => least(${capSeconds}::float8, ${baseSeconds}::float8 * power(2, ${failures} - ${free} - 1)))
						ELSE NULL END`
				}
			});
	}
}

/** A correct password clears the account's count (the address keeps its count: one success must not unlock guessing). */
export async function clearFailures(keys: ThrottleKey[]): Promise<void> {
	const accountKeys = keys.filter((k) => k.kind === 'account').map((k) => k.key);
	if (accountKeys.length) await db.delete(signInThrottle).where(inArray(signInThrottle.key, accountKeys));
}

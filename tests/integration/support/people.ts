// Test people: the seeded demo accounts and fresh throwaway accounts, each with a real session.
import { readFileSync } from 'node:fs';
import { randomBytes } from 'node:crypto';
import { eq, inArray } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { users, type Role } from '$lib/server/db/schema';
import { createSessionFor, sessionCookieName } from '$lib/server/auth';
import { signUp } from '$lib/server/accounts';
import { makeCookies } from './request-event';

type Demo = { role: Role; email: string; password: string };
export const demo: Demo[] = JSON.parse(readFileSync('scripts/demo-accounts.json', 'utf8'));

export function demoAccount(role: Role): Demo {
	return demo.find((d) => d.role === role)!;
}

export async function userIdOf(email: string): Promise<string> {
	const row = await db.query.users.findFirst({ where: eq(users.email, email) });
	if (!row) throw new Error(`no user ${email}: was the demo seeded?`);
	return row.id;
}

/** A cookie jar holding a fresh session for the person. */
export async function signedInCookies(email: string) {
	const sessionId = await createSessionFor(await userIdOf(email));
	return makeCookies({ [sessionCookieName]: sessionId });
}

const created: string[] = [];

/** A new learner with a unique address (test runs share one database); remove them with `removeFreshPeople`. */
export async function freshLearner(password = 'a long test passphrase') {
	const email = `t-${randomBytes(5).toString('hex')}@test.example`;
	const made = await signUp({ name: 'Test Person', email, password });
	if (!made.ok) throw new Error(made.message);
	created.push(made.userId);
	return { id: made.userId, email, password };
}

/** Deletes the people this file created (their sessions and links go with them), so other suites see only the demo. */
export async function removeFreshPeople(): Promise<void> {
	if (created.length) await db.delete(users).where(inArray(users.id, created.splice(0)));
}

/** A documentation-range IPv6 address (RFC 3849) unique to the caller, so one test's throttling cannot touch another's. */
export function testAddress(): string {
	const hex = () => randomBytes(2).toString('hex');
	return `2001:db8::${hex()}:${hex()}:${hex()}`;
}

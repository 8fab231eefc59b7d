// Sessions (Lucia v3 over Drizzle/PostgreSQL): the only module that creates, reads or ends a session.
import { Lucia } from 'lucia';
import { DrizzlePostgreSQLAdapter } from '@lucia-auth/adapter-drizzle';
import type { Cookies } from '@sveltejs/kit';
import { eq } from 'drizzle-orm';
import { db, type Db } from './db';
import { sessions, users, type Role } from './db/schema';

/** Secure cookies whenever the public origin is https (production); plain http in dev and tests. */
export const secureCookies = (process.env.ORIGIN ?? '').startsWith('https:');

const adapter = new DrizzlePostgreSQLAdapter(db, sessions, users);

export const lucia = new Lucia(adapter, {
	sessionCookie: {
		name: 'stopwise_session',
		attributes: { secure: secureCookies, sameSite: 'lax', path: '/' }
	},
	getUserAttributes: (row) => ({
		email: row.email,
		name: row.name,
		emailVerified: row.emailVerified,
		roles: row.roles
	})
});

declare module 'lucia' {
	interface Register {
		Lucia: typeof lucia;
		DatabaseUserAttributes: { email: string; name: string; emailVerified: boolean; roles: Role[] };
	}
}

export type AuthUser = import('lucia').User;
export type AuthSession = import('lucia').Session;

function writeCookie(cookies: Cookies, cookie: import('lucia').Cookie): void {
	cookies.set(cookie.name, cookie.value, { ...cookie.attributes, path: '/' });
}

/** Reads the session cookie, extends a session that is half-way to expiry, clears a dead cookie. */
export async function readSession(cookies: Cookies): Promise<{ user: AuthUser | null; session: AuthSession | null }> {
	const sessionId = cookies.get(lucia.sessionCookieName);
	if (!sessionId) return { user: null, session: null };
	const { session, user } = await lucia.validateSession(sessionId);
	if (session?.fresh) writeCookie(cookies, lucia.createSessionCookie(session.id));
	if (!session) writeCookie(cookies, lucia.createBlankSessionCookie());
	return { user, session };
}

/**
 * Starts a new session with a new id and sets its cookie. A session the browser already had
 * is ended first, so an id planted before sign-in never becomes a signed-in session.
 */
export async function startSession(cookies: Cookies, userId: string, previousSessionId?: string | null): Promise<void> {
	if (previousSessionId) await lucia.invalidateSession(previousSessionId);
	const session = await lucia.createSession(userId, {});
	writeCookie(cookies, lucia.createSessionCookie(session.id));
}

/** Ends one session (sign out) and clears its cookie. */
export async function endSession(cookies: Cookies, sessionId: string | null | undefined): Promise<void> {
	if (sessionId) await lucia.invalidateSession(sessionId);
	writeCookie(cookies, lucia.createBlankSessionCookie());
}

/** Ends every session of a person; takes a transaction so it commits with the change that caused it. */
export async function endAllSessions(userId: string, tx: Pick<Db, 'delete'> = db): Promise<void> {
	await tx.delete(sessions).where(eq(sessions.userId, userId));
}

/** Sessions a person has open now (for the account page). */
export async function countSessions(userId: string): Promise<number> {
	return (await lucia.getUserSessions(userId)).length;
}

/** The cookie's name, for tests and tools that have to present a session. */
export const sessionCookieName = lucia.sessionCookieName;

/** Creates a session without a browser (tests, scripts) and returns its id. */
export async function createSessionFor(userId: string): Promise<string> {
	return (await lucia.createSession(userId, {})).id;
}

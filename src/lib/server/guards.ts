// Server-side access checks: pages redirect to sign-in and back, API routes answer 401/403 as JSON.
import { error, json, redirect } from '@sveltejs/kit';
import type { Role } from './db/schema';
import type { AuthUser } from './auth';

type Who = { locals: App.Locals; url: URL };

const roleNames: Record<Role, string> = {
	learner: 'learners',
	mentor: 'mentors',
	author: 'authors',
	admin: 'admins'
};

/** A same-origin path to return to, or the fallback: never another host, scheme or protocol-relative URL. */
export function safeRedirectPath(target: string | null | undefined, fallback = '/courses'): string {
	if (!target || !target.startsWith('/') || target.startsWith('//') || target.startsWith('/\\')) return fallback;
	try {
		const base = 'http://stopwise.invalid';
		const parsed = new URL(target, base);
		if (parsed.origin !== base) return fallback;
		return parsed.pathname + parsed.search + parsed.hash;
	} catch {
		return fallback;
	}
}

export function signInPath(url: URL): string {
	return `/signin?redirectTo=${encodeURIComponent(url.pathname + url.search)}`;
}

/** For pages and form actions: the signed-in person, or a redirect to sign-in that comes back here. */
export function requireUser({ locals, url }: Who): AuthUser {
	if (!locals.user) redirect(303, signInPath(url));
	return locals.user;
}

/** For pages and form actions: the signed-in person holding `role`; others get sign-in or a 403 page. */
export function requireRole(who: Who, role: Role): AuthUser {
	const user = requireUser(who);
	if (!user.roles.includes(role)) error(403, { message: `This page is for ${roleNames[role]}.` });
	return user;
}

export type ApiAccess = { ok: true; user: AuthUser } | { ok: false; response: Response };

/** For API routes: the signed-in person (holding `role` when given), or a JSON 401/403 to return as is. */
export function checkApiAccess(locals: App.Locals, role?: Role): ApiAccess {
	const user = locals.user;
	if (!user) return { ok: false, response: json({ error: 'unauthenticated', message: 'Sign in first.' }, { status: 401 }) };
	if (role && !user.roles.includes(role)) {
		return {
			ok: false,
			response: json({ error: 'forbidden', message: `Only ${roleNames[role]} may use this.` }, { status: 403 })
		};
	}
	return { ok: true, user };
}

// Request hooks: security headers, then the session (who is signed in, with which roles) into locals.
import type { Handle, HandleServerError } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { client } from '$lib/server/db';
import { readSession } from '$lib/server/auth';

// adapter-node waits for open handles before exiting: close the pool on shutdown
process.on('sveltekit:shutdown', () => {
	void client.end({ timeout: 5 });
});

const securityHeaders: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	response.headers.set('x-content-type-options', 'nosniff');
	response.headers.set('referrer-policy', 'same-origin');
	return response;
};

export const authenticate: Handle = async ({ event, resolve }) => {
	// if the database is unreachable, carry on signed out (less access, never more): /api/health can still say so
	const { user, session } = await readSession(event.cookies).catch((e: unknown) => {
		console.error('[auth] could not read the session', e instanceof Error ? e.message : e);
		return { user: null, session: null };
	});
	event.locals.user = user;
	event.locals.session = session;
	event.locals.roles = user?.roles ?? [];
	return resolve(event);
};

export const handle = sequence(securityHeaders, authenticate);

export const handleError: HandleServerError = ({ error, event, status }) => {
	if (status !== 404) console.error(`[${event.request.method} ${event.url.pathname}]`, error);
	return { message: status === 404 ? 'Not found.' : 'Something went wrong on our side. Please try again.' };
};

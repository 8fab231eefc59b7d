// Request hooks: security headers, the visitor page cache (public pages a visitor without cookies gets from memory),
// the input gate (body limits, unstorable characters), then the session (who is signed in, with which roles) into locals.
import type { Handle, HandleServerError, ServerInit } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { building } from '$app/environment';
import { client } from '$lib/server/db';
import { readSession } from '$lib/server/auth';
import { closeQueue } from '$lib/server/attempts/queue';
import { closeUploadLocker } from '$lib/server/attempts/uploads/pg-locker';
import { sweepTemporaryFiles } from '$lib/server/attempts/uploads/sweep';
import { startInlineWorker } from '$lib/server/attempts/worker';
import { readCatalogue } from '$lib/server/lessons/catalogue';
import { closeCompilePool } from '$lib/server/lessons/compile-pool';
import { guardInput } from '$lib/server/edge/guard-input';
import { visitorPageCache } from '$lib/server/visitor-pages';

// adapter-node waits for open handles before exiting: stop the job queue and the upload locks, then close the pool
process.on('sveltekit:shutdown', () => {
	void Promise.allSettled([closeQueue(), closeCompilePool(), closeUploadLocker()]).finally(() => client.end({ timeout: 5 }));
});

/** Grading runs inside the app unless STOPWISE_INLINE_WORKER=0; never while building. Not awaited: pages need not wait. */
export const init: ServerInit = async () => {
	if (building) return;
	// the course files are checked once at start-up: a broken one stops the app, naming the file
	await readCatalogue();
	void startInlineWorker();
	// what a crash of this node left in its own upload folder (the workers' hourly sweep may run on other machines)
	void sweepTemporaryFiles().catch((error: unknown) => console.error('[uploads] temporary files not swept', error instanceof Error ? error.message : error));
};

/** On every response (pages get their Content-Security-Policy from `kit.csp` in svelte.config.js). */
export const securityHeaders: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	response.headers.set('x-content-type-options', 'nosniff');
	response.headers.set('referrer-policy', 'same-origin');
	// for browsers that predate CSP frame-ancestors: no page of ours inside anyone's frame
	response.headers.set('x-frame-options', 'DENY');
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

// the cache answers only cookieless GETs of allow-listed pages, which neither the gate nor the session would change
export const handle = sequence(securityHeaders, visitorPageCache.handle, guardInput, authenticate);

export const handleError: HandleServerError = ({ error, event, status }) => {
	if (status !== 404) console.error(`[${event.request.method} ${event.url.pathname}]`, error);
	return { message: status === 404 ? 'Not found.' : 'Something went wrong on our side. Please try again.' };
};

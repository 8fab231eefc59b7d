// A learner's private calendar feed (RFC 5545): opened by the secret in its address, no session (calendar apps have none).
import { json } from '@sveltejs/kit';
import { feedOwner, learnerFeed } from '$lib/server/field-days/calendar';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ params, url }) => {
	// calendar apps often ask for the address with ".ics" on the end
	const owner = await feedOwner(params.token.replace(/\.ics$/, ''));
	if (!owner) return json({ error: 'not-found', message: 'There is no calendar at this address.' }, { status: 404 });
	return new Response(await learnerFeed(owner, url.origin), {
		headers: { 'content-type': 'text/calendar; charset=utf-8', 'cache-control': 'private, no-store', 'x-robots-tag': 'noindex' }
	});
};

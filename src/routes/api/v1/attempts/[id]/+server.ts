// GET an Attempt's live status; with ?wait=N&known=<status> it answers as soon as the status moves on (long poll).
import { json } from '@sveltejs/kit';
import { checkApiAccess } from '$lib/server/guards';
import { readWhenChanged } from '$lib/server/attempts/events';
import { readAttemptStatus } from '$lib/server/attempts/history';
import type { RequestHandler } from './$types';

const MAX_WAIT_SECONDS = 25;

export const GET: RequestHandler = async ({ locals, params, url }) => {
	const access = checkApiAccess(locals);
	if (!access.ok) return access.response;
	const wait = Math.min(MAX_WAIT_SECONDS, Math.max(0, Number(url.searchParams.get('wait')) || 0));
	const known = url.searchParams.get('known');
	const status = await readWhenChanged(
		params.id,
		() => readAttemptStatus(access.user, params.id),
		(s) => s === null || s.status !== known,
		known ? wait * 1000 : 0
	);
	if (!status) return json({ error: 'not-found', message: 'There is no such attempt.' }, { status: 404 });
	return json(status, { headers: { 'cache-control': 'no-store' } });
};

// The issuer profile every certificate names (Open Badges 3.0 Profile), with where its keys are published.
import { json } from '@sveltejs/kit';
import { issuerProfile } from '$lib/server/credentials/document';
import { publicOrigin } from '$lib/server/credentials/issue';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = ({ url }) => {
	return json(issuerProfile(publicOrigin(url.origin)), { headers: { 'cache-control': 'public, max-age=300', 'access-control-allow-origin': '*' } });
};

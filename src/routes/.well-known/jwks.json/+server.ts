// The school's public signing keys as a JSON Web Key Set (RFC 7517): what anyone needs to check a certificate's signature.
import { json } from '@sveltejs/kit';
import { publicJwks } from '$lib/server/credentials/keys';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async () => {
	return json(await publicJwks(), { headers: { 'cache-control': 'public, max-age=300', 'access-control-allow-origin': '*' } });
};
